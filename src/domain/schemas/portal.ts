import { z } from 'zod';
import { uuid } from './common';

/** A household's request for a visit (portal "Ask for a visit"). */
export const serviceRequestSchema = z.object({
  description: z.string({ error: 'Describe what needs attention.' }).trim().min(1, 'Describe what needs attention.').max(2000, 'Keep it under 2000 characters.'),
  preferredTimes: z.string({ error: 'Say when suits you.' }).trim().min(1, 'Say when suits you.').max(500, 'Keep it under 500 characters.'),
  zoneId: uuid.optional(),
});
export type ServiceRequestInput = z.input<typeof serviceRequestSchema>;
