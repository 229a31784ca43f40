/**
 * Photos and files of a job: recognised by their content (PNG, JPEG, WebP, PDF), stored under
 * tenants/<tenantId>/ through the storage module as documents of the job's site, images with a
 * JPEG thumbnail about 320 px wide. An image over the pixel limit is refused from its header
 * before anything decodes it; the thumbnail is made by a worker thread (thumbnails.ts), never
 * on the event loop.
 */
import { type Ctx } from '../context';
import { errors } from '../errors';
import { Document } from '../models/Document';
import type { Job } from '../models/Job';
import { sniffImage, sniffPdf, type TenantFiles } from '../storage/tenant-files';
import { recordAudit } from './audit-recorder';
import { safeFileName, titleFrom } from './documents';
import { checkImageHeader } from './image-header';
import { ThumbnailDecodeError, ThumbnailUnavailableError, type Thumbnailer } from './thumbnails';

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
 * A JPEG thumbnail about 320 px wide (never enlarged), made in a worker thread, or null for a
 * format we do not decode (WebP). The image's header is checked first (pixel limit, readable),
 * so nothing too large is ever decoded. A PNG or JPEG that cannot be decoded is refused (415): it
 * is not the image it claims to be.
 */
export async function makeThumbnail(thumbnails: Thumbnailer, data: Buffer, type: DetectedType): Promise<Buffer | null> {
  if (!type.image) return null;
  checkImageHeader(data, type.extension.toUpperCase());
  if (type.contentType === 'image/webp') return null;
  try {
    return await thumbnails.make(data, { width: THUMBNAIL_WIDTH, quality: THUMBNAIL_QUALITY });
  } catch (err) {
    if (err instanceof ThumbnailUnavailableError) throw errors.serviceUnavailable(`The photo was not stored: ${err.message} Try again in a minute.`);
    if (err instanceof ThumbnailDecodeError)
      throw errors.unsupportedType(`This file starts like a ${type.extension.toUpperCase()} image but cannot be read as one, so it was not stored. Export the photo again and retry.`, {
        file: 'The image cannot be read.',
      });
    throw err;
  }
}

/** What an upload becomes before anything is stored: its type and thumbnail (call outside a transaction). */
export interface PreparedJobFile {
  type: DetectedType;
  thumbnail: Buffer | null;
}

/** Recognises the file and makes its thumbnail, off the event loop and before any transaction opens. */
export async function prepareJobFile(thumbnails: Thumbnailer, data: Buffer): Promise<PreparedJobFile> {
  const type = detectJobFileType(data);
  return { type, thumbnail: await makeThumbnail(thumbnails, data, type) };
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
export async function addJobFile(ctx: Ctx, files: TenantFiles, job: Job, input: JobFileInput, prepared: PreparedJobFile, stored: string[]): Promise<Document> {
  const { type, thumbnail } = prepared;
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
