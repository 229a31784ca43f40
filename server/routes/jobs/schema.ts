import { z } from 'zod';
import { listQuery, uuid } from '@domain/schemas/common';
import { documentSchema } from '@domain/schemas/document';
import { jobTransitionSchema } from '@domain/schemas/job';
import { HISTORY_TYPES } from '../../services/service-history';

export const jobParams = z.object({ jobId: uuid });
export const documentParams = z.object({ documentId: uuid });
export const siteParams = z.object({ siteId: uuid });

/**
 * A transition, and for battery changes and service calls completed: the zones whose battery
 * was changed (their battery-changed date becomes the completion date at the site).
 */
export const transitionBody = jobTransitionSchema;

/** The fields sent with a job file upload (multipart strings). */
export const jobFileFields = documentSchema.pick({ title: true, sharedWithClient: true });

export const historyQuery = listQuery.pick({ page: true, pageSize: true }).extend({
  type: z.enum(HISTORY_TYPES, { error: `Use one of ${HISTORY_TYPES.join(', ')}.` }).optional(),
});
