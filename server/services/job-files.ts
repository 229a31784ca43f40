/**
 * Photos and files of a job: recognised by their content (PNG, JPEG, WebP, PDF), stored under
 * tenants/<tenantId>/ through the storage module as documents of the job's site, images with a
 * JPEG thumbnail about 320 px wide (jimp, pure JavaScript).
 */
import { Jimp } from 'jimp';
import { type Ctx } from '../context';
import { errors } from '../errors';
import { Document } from '../models/Document';
import type { Job } from '../models/Job';
import { sniffImage, sniffPdf, type TenantFiles } from '../storage/tenant-files';
import { recordAudit } from './audit-recorder';
import { safeFileName, titleFrom } from './documents';

export const THUMBNAIL_WIDTH = 320;
const THUMBNAIL_QUALITY = 78;

/** What a job file may be, in words (the 415 message and the form's hint). */
export const JOB_FILE_TYPES_TEXT = 'a photo (PNG, JPEG or WebP) or a PDF';

export interface DetectedType {
  contentType: string;
  extension: string;
  image: boolean;
}

/** The file's type from its first bytes, or 415 naming what is allowed; the name never counts. */
export function detectJobFileType(data: Buffer): DetectedType {
  const image = sniffImage(data);
  if (image) return { ...image, image: true };
  const pdf = sniffPdf(data);
  if (pdf) return { ...pdf, image: false };
  throw errors.unsupportedType(
    `A job file must be ${JOB_FILE_TYPES_TEXT}. This file’s content is none of those, whatever its name says, so it was not stored.`,
  );
}

/**
 * A JPEG thumbnail about 320 px wide (never enlarged), or null for a format jimp does not
 * read (WebP). A PNG or JPEG that cannot be decoded is refused (415): it is not the image it
 * claims to be.
 */
export async function makeThumbnail(data: Buffer, type: DetectedType): Promise<Buffer | null> {
  if (!type.image || type.contentType === 'image/webp') return null;
  let image: Awaited<ReturnType<typeof Jimp.read>>;
  try {
    image = await Jimp.read(data);
  } catch {
    throw errors.unsupportedType(`This file starts like a ${type.extension.toUpperCase()} image but cannot be read as one, so it was not stored. Export the photo again and retry.`);
  }
  if (image.width > THUMBNAIL_WIDTH) image.resize({ w: THUMBNAIL_WIDTH });
  return image.getBuffer('image/jpeg', { quality: THUMBNAIL_QUALITY });
}

export interface JobFileInput {
  data: Buffer;
  originalName: string;
  title: string;
  sharedWithClient: boolean;
}

/**
 * Stores a job file and its thumbnail, then records the document (call inside a transaction).
 * Every stored file id is pushed to `stored`, so the caller can remove them if anything fails
 * before the transaction commits: nothing is left behind on error.
 */
export async function addJobFile(ctx: Ctx, files: TenantFiles, job: Job, input: JobFileInput, stored: string[]): Promise<Document> {
  const type = detectJobFileType(input.data);
  const thumbnail = await makeThumbnail(input.data, type);
  const fileId = await files.save(job.tenantId, input.data, type.extension);
  stored.push(fileId);
  const thumbnailFileId = thumbnail ? await files.save(job.tenantId, thumbnail, 'jpg') : null;
  if (thumbnailFileId) stored.push(thumbnailFileId);
  const originalName = safeFileName(input.originalName, type.extension);
  const doc = await Document.create(
    {
      tenantId: job.tenantId,
      siteId: job.siteId,
      jobId: job.id,
      kind: type.image ? 'photo' : 'other',
      title: input.title || titleFrom(originalName),
      fileId,
      contentType: type.contentType,
      sizeBytes: input.data.length,
      originalName,
      sharedWithClient: input.sharedWithClient,
      uploadedById: ctx.user?.id ?? null,
      thumbnailFileId,
    },
    { transaction: ctx.transaction ?? null },
  );
  await recordAudit(ctx, {
    action: 'document.uploaded',
    subjectType: 'Document',
    subjectId: doc.id,
    details: { siteId: job.siteId, jobId: job.id, kind: doc.kind, contentType: doc.contentType, sizeBytes: doc.sizeBytes, sharedWithClient: doc.sharedWithClient },
  });
  return doc;
}

/** Removes stored files after a failure (best effort: a missing file is fine). */
export async function removeStored(files: TenantFiles, tenantId: string, stored: readonly string[]): Promise<void> {
  await Promise.all(stored.map((id) => files.remove(tenantId, id).catch(() => undefined)));
}
