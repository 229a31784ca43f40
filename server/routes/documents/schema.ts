import { z } from 'zod';
import { listQuery, uuid } from '@domain/schemas/common';

export const documentParams = z.object({ documentId: uuid });
export const siteDocumentsParams = z.object({ siteId: uuid });
export const documentListQuery = listQuery;
