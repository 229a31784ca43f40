import { z } from 'zod';
import { optionalText } from './common';

export const DOCUMENT_KINDS = ['permit', 'contract', 'certificate', 'photo', 'floor_plan', 'other'] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];

export const DOCUMENT_KIND_LABELS: Record<DocumentKind, string> = {
  permit: 'Alarm permit',
  contract: 'Monitoring contract',
  certificate: 'Certificate',
  photo: 'Photo',
  floor_plan: 'Floor plan',
  other: 'Other',
};

/** Uploads: PDF and images, sniffed by content, at most 10 MB. */
export const DOCUMENT_MAX_BYTES = 10 * 1024 * 1024;

const booleanish = z.preprocess((v) => (v === 'true' ? true : v === 'false' ? false : v), z.boolean({ error: 'sharedWithClient is true or false.' }));

/** The fields sent with a multipart upload (strings) or a PATCH (JSON). */
export const documentSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS, { error: 'Choose what kind of document this is.' }),
  title: optionalText(200).default(''),
  sharedWithClient: booleanish.default(false),
});
export const documentPatchSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS, { error: 'Choose what kind of document this is.' }).optional(),
  title: z.string().trim().min(1, 'Give the document a title.').max(200, 'Use at most 200 characters.').optional(),
  sharedWithClient: booleanish.optional(),
});
