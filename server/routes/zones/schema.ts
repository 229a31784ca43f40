import { z } from 'zod';
import { uuid } from '@domain/schemas/common';

export const zoneParams = z.object({ zoneId: uuid });

/** A panel holds at most 999 zones: by default the whole list is one page. */
export const ZONE_PAGE_MAX = 1000;
export const zoneListQuery = z.object({
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, 'page starts at 1.').default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize must be a number.' })
    .int()
    .min(1, 'pageSize must be at least 1.')
    .max(ZONE_PAGE_MAX, `pageSize is at most ${ZONE_PAGE_MAX}.`)
    .default(ZONE_PAGE_MAX),
});

export const importQuery = z.object({
  dryRun: z
    .enum(['true', 'false', '1', '0'], { error: 'dryRun is true or false.' })
    .optional()
    .transform((v) => v === 'true' || v === '1'),
});
