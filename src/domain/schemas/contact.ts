import { z } from 'zod';
import { optionalText, patchOf, personName } from './common';
import { optionalPhone, requiredPhone } from './client';

/** An emergency contact the monitoring center calls; position 1 is called first. */
export const contactSchema = z.object({
  name: personName,
  relation: optionalText(60).default(''),
  phone: requiredPhone,
  altPhone: optionalPhone.default(''),
  position: z.number({ error: 'position is a number.' }).int().min(1, 'Positions start at 1.').max(20).optional(),
});
export type ContactInput = z.input<typeof contactSchema>;
export const contactPatchSchema = patchOf(contactSchema);

/** The whole ordered list, replaced at once (portal and staff reordering). */
export const contactListSchema = z.object({
  contacts: z.array(contactSchema.omit({ position: true })).max(10, 'Keep at most 10 emergency contacts.'),
});
