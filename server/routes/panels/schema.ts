import { z } from 'zod';
import { listQuery, uuid } from '@domain/schemas/common';

export const siteParams = z.object({ siteId: uuid });
export const panelParams = z.object({ panelId: uuid });
export const panelListQuery = listQuery;
export const changesQuery = listQuery.pick({ page: true, pageSize: true });
