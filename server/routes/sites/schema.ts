import { z } from 'zod';
import { uuid } from '@domain/schemas/common';

export const siteParams = z.object({ siteId: uuid });
