/**
 * The one way a route reads a single uploaded file (multer, in memory, nothing on disk). Every
 * failure of the multipart body is the sender's: over the size limit → 413 with the route's own
 * message; a multer limit (too many parts, an unexpected field) → 400 naming the field; a
 * malformed, cut-off or boundary-less body (busboy's plain errors: "Unexpected end of form",
 * "Malformed part header", "Multipart: Boundary not found") → 400 naming `file`. None of these
 * reaches the error handler as an unknown error, so none is a 500 or logged as one.
 */
import type { Request, Response } from 'express';
import multer from 'multer';
import { errors } from '../errors';

export interface SingleUploadOptions {
  /** the largest file in bytes */
  maxBytes: number;
  /** the 413 message, naming the limit in the route's words */
  tooLargeMessage: string;
  /** what the user should choose again, e.g. "the image", "the CSV file" */
  what: string;
  /** multer limits besides the file size */
  limits?: Omit<multer.Options['limits'] & object, 'fileSize'>;
  /** the form field holding the file (default `file`) */
  field?: string;
}

/** A reader for one file in `field`; resolves when `req.file` and `req.body` are set. */
export function singleUpload(options: SingleUploadOptions): (req: Request, res: Response) => Promise<void> {
  const field = options.field ?? 'file';
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { files: 1, ...options.limits, fileSize: options.maxBytes },
    defParamCharset: 'utf8',
  }).single(field);

  return (req, res) =>
    new Promise((resolve, reject) => {
      upload(req, res, (err: unknown) => {
        if (!err) return resolve();
        if (err instanceof multer.MulterError) {
          if (err.code === 'LIMIT_FILE_SIZE') return reject(errors.tooLarge(options.tooLargeMessage));
          const name = err.field ?? field;
          return reject(errors.validation(`${name}: Upload not accepted: ${err.message}.`, { [name]: `${err.message}.` }));
        }
        // a malformed or cut-off multipart body is bad input, not a server fault
        reject(
          errors.validation(`${field}: The upload could not be read. Choose ${options.what} again and retry.`, {
            [field]: 'The upload was incomplete or malformed.',
          }),
        );
      });
    });
}
