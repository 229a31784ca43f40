import { z } from 'zod';
import { uuid } from '@domain/schemas/common';

export const clientParams = z.object({ clientId: uuid });
