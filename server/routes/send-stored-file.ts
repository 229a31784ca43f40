import type { Response } from 'express';
import { errors } from '../errors';
import type { TenantFiles } from '../storage/tenant-files';

/** How long a browser may keep a file: never (private records), or a while when its address changes with it. */
export type FileCaching = 'no-store' | 'private-hour' | 'public-day';

const CACHE_CONTROL: Record<FileCaching, string> = {
  'no-store': 'private, no-store',
  'private-hour': 'private, max-age=3600',
  'public-day': 'public, max-age=86400',
};

/**
 * Sends a file from a firm's storage: its declared type, never sniffed, with the caching
 * asked for, as a download when it has a name. A file missing from storage is a 404 naming
 * what was asked for, never a 500.
 */
export async function sendStoredFile(
  res: Response,
  files: TenantFiles,
  file: { tenantId: string; fileId: string; contentType: string; what: string; caching: FileCaching; downloadName?: string | undefined },
): Promise<void> {
  let data: Buffer;
  try {
    data = await files.read(file.tenantId, file.fileId);
  } catch {
    throw errors.notFound(file.what);
  }
  res.set('Content-Type', file.contentType);
  res.set('X-Content-Type-Options', 'nosniff');
  res.set('Cache-Control', CACHE_CONTROL[file.caching]);
  if (file.downloadName) res.attachment(file.downloadName);
  res.send(data);
}
