/**
 * The only code that touches tenants/: every path resolves under tenants/<tenantId>/, file
 * names are generated ids, and anything that would leave the firm's folder is refused.
 */
import crypto from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';

const ID = /^[0-9a-f-]{36}$/;
const FILE_ID = /^[0-9a-f-]{36}\.[a-z0-9]{1,8}$/;

export class TenantFiles {
  readonly root: string;

  constructor(root: string) {
    this.root = path.resolve(root);
  }

  /** Absolute path of a stored file; throws on anything that is not a generated id. */
  resolve(tenantId: string, fileId: string): string {
    if (!ID.test(tenantId)) throw new Error('Invalid firm id for storage.');
    if (!FILE_ID.test(fileId)) throw new Error('Invalid file id.');
    const dir = path.join(this.root, tenantId);
    const full = path.resolve(dir, fileId);
    if (path.dirname(full) !== dir) throw new Error('Path leaves the firm folder.');
    return full;
  }

  async save(tenantId: string, data: Buffer, extension: string): Promise<string> {
    const fileId = `${crypto.randomUUID()}.${extension.toLowerCase()}`;
    const full = this.resolve(tenantId, fileId);
    await fs.mkdir(path.dirname(full), { recursive: true });
    await fs.writeFile(full, data, { flag: 'wx' });
    return fileId;
  }

  async read(tenantId: string, fileId: string): Promise<Buffer> {
    return fs.readFile(this.resolve(tenantId, fileId));
  }

  async remove(tenantId: string, fileId: string): Promise<void> {
    await fs.rm(this.resolve(tenantId, fileId), { force: true });
  }
}

/** Recognises an image by its first bytes, never by the name or the declared type. */
export function sniffImage(data: Buffer): { contentType: string; extension: string } | null {
  if (data.length >= 8 && data.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])))
    return { contentType: 'image/png', extension: 'png' };
  if (data.length >= 3 && data[0] === 0xff && data[1] === 0xd8 && data[2] === 0xff)
    return { contentType: 'image/jpeg', extension: 'jpg' };
  if (data.length >= 12 && data.toString('ascii', 0, 4) === 'RIFF' && data.toString('ascii', 8, 12) === 'WEBP')
    return { contentType: 'image/webp', extension: 'webp' };
  return null;
}

/** Recognises a PDF by its header (`%PDF-` at the very start), never by the name or the declared type. */
export function sniffPdf(data: Buffer): { contentType: string; extension: string } | null {
  if (data.length >= 5 && data.toString('latin1', 0, 5) === '%PDF-') return { contentType: 'application/pdf', extension: 'pdf' };
  return null;
}
