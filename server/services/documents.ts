import type { DocumentKind } from '@domain/schemas/document';
import { scoped, type Ctx } from '../context';
import { Document } from '../models/Document';
import type { Site } from '../models/Site';
import { recordAudit } from './audit-recorder';

export interface DocumentFields {
  kind: DocumentKind;
  title: string;
  sharedWithClient: boolean;
}

export interface StoredUpload {
  fileId: string;
  contentType: string;
  extension: string;
  sizeBytes: number;
  originalName: string;
}

/**
 * A file name safe to offer in Content-Disposition: the last path segment only, without
 * control, formatting (bidi) or quoting characters, at most 120 characters, ending in the
 * extension of the detected type (a name claiming another type gets the right one added).
 */
export function safeFileName(original: string, extension: string): string {
  const last = original.split(/[\\/]/).pop() ?? '';
  const cleaned = last
    .normalize('NFC')
    .replace(/\s+/g, ' ')
    .replace(/[\p{Cc}\p{Cf}"*:<>?|;%]/gu, '')
    .trim();
  const lower = cleaned.toLowerCase();
  const suffix = [`.${extension}`, ...(extension === 'jpg' ? ['.jpeg'] : [])].find((e) => lower.endsWith(e));
  const stem = (suffix ? cleaned.slice(0, -suffix.length) : cleaned)
    .replace(/^[.\s]+/, '')
    .slice(0, 110)
    .trim();
  return `${stem || 'document'}${suffix ? cleaned.slice(-suffix.length) : `.${extension}`}`;
}

/** A title from the file name when none was given ("Permit 2026.pdf" → "Permit 2026"). */
export function titleFrom(originalName: string): string {
  const base = originalName.replace(/\.[A-Za-z0-9]{1,8}$/, '').trim();
  return (base || 'Document').slice(0, 200);
}

/** Records an uploaded file (already stored by the caller) for a site. */
export async function createDocument(ctx: Ctx, site: Site, upload: StoredUpload, fields: DocumentFields): Promise<Document> {
  const doc = await Document.create(
    {
      tenantId: scoped(ctx).tenantId,
      siteId: site.id,
      kind: fields.kind,
      title: fields.title || titleFrom(upload.originalName),
      fileId: upload.fileId,
      contentType: upload.contentType,
      sizeBytes: upload.sizeBytes,
      originalName: upload.originalName,
      sharedWithClient: fields.sharedWithClient,
      uploadedById: ctx.user?.id ?? null,
    },
    { transaction: ctx.transaction },
  );
  await recordAudit(ctx, {
    action: 'document.uploaded',
    subjectType: 'Document',
    subjectId: doc.id,
    details: { siteId: site.id, kind: doc.kind, contentType: doc.contentType, sizeBytes: doc.sizeBytes, sharedWithClient: doc.sharedWithClient },
  });
  return doc;
}

/** Changes title, kind or sharing; the audit names what changed. */
export async function updateDocument(ctx: Ctx, doc: Document, patch: Partial<DocumentFields>): Promise<Document> {
  const changed = (Object.keys(patch) as (keyof DocumentFields)[]).filter((k) => patch[k] !== undefined && patch[k] !== doc.get(k));
  if (changed.length === 0) return doc;
  for (const key of changed) doc.set(key, patch[key] as never);
  await doc.save({ transaction: ctx.transaction });
  await recordAudit(ctx, {
    action: changed.includes('sharedWithClient') ? (doc.sharedWithClient ? 'document.shared' : 'document.unshared') : 'document.updated',
    subjectType: 'Document',
    subjectId: doc.id,
    details: { siteId: doc.siteId, changed },
  });
  return doc;
}

/** Deletes the record; the caller removes the stored file once the transaction has committed. */
export async function deleteDocument(ctx: Ctx, doc: Document): Promise<void> {
  await doc.destroy({ transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'document.deleted', subjectType: 'Document', subjectId: doc.id, details: { siteId: doc.siteId, title: doc.title } });
}
