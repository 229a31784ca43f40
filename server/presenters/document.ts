import type { Document } from '../models/Document';
import type { Audience } from './client';

/**
 * A site document's record (never its bytes, never its storage id). Staff also see who
 * uploaded it and where to download it; the portal serves shared documents its own way.
 */
export function presentDocument(doc: Document, { audience }: { audience: Audience }) {
  const base = {
    id: doc.id,
    siteId: doc.siteId,
    kind: doc.kind,
    title: doc.title,
    contentType: doc.contentType,
    sizeBytes: doc.sizeBytes,
    originalName: doc.originalName,
    sharedWithClient: doc.sharedWithClient,
    createdAt: doc.createdAt.toISOString(),
    updatedAt: doc.updatedAt.toISOString(),
  };
  if (audience === 'client') return base;
  return { ...base, uploadedById: doc.uploadedById, fileUrl: `/api/documents/${doc.id}/file` };
}
export type PresentedDocument = ReturnType<typeof presentDocument>;
