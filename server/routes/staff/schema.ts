import { z } from 'zod';
import { listQuery, uuid } from '@domain/schemas/common';

export const staffListQuery = listQuery;
export const userParams = z.object({ userId: uuid });
export const invitationParams = z.object({ invitationId: uuid });
