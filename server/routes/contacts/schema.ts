import { z } from 'zod';
import { uuid } from '@domain/schemas/common';

export const contactParams = z.object({ contactId: uuid });
export const siteContactsParams = z.object({ siteId: uuid });
