import { z } from 'zod';
import { uuid } from '@domain/schemas/common';

export const siteParams = z.object({ siteId: uuid });
export const floorParams = z.object({ floorId: uuid });
export const roomParams = z.object({ roomId: uuid });
export const openingParams = z.object({ openingId: uuid });

/** A site has a handful of floors: by default the whole list is one page. */
export const FLOOR_PAGE_MAX = 100;
export const floorListQuery = z.object({
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, 'page starts at 1.').default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize must be a number.' })
    .int()
    .min(1, 'pageSize must be at least 1.')
    .max(FLOOR_PAGE_MAX, `pageSize is at most ${FLOOR_PAGE_MAX}.`)
    .default(FLOOR_PAGE_MAX),
});
