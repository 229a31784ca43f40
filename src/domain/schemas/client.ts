import { z } from 'zod';
import { isPossiblePhone, normalizePhone } from '../phone';
import { email, listQuery, optionalText, patchOf, personName } from './common';

export const CLIENT_STATUSES = ['active', 'cancelled'] as const;

/** A phone number field: empty allowed, otherwise a possible number, stored in E.164. */
export const optionalPhone = z
  .string({ error: 'Enter a phone number.' })
  .trim()
  .max(40, 'Use at most 40 characters.')
  .refine((v) => v === '' || isPossiblePhone(v), 'Enter a phone number with its area code, like (555) 010-4400.')
  .transform((v) => (v === '' ? '' : normalizePhone(v)));

export const requiredPhone = z
  .string({ error: 'Enter a phone number.' })
  .trim()
  .min(1, 'Enter a phone number.')
  .max(40, 'Use at most 40 characters.')
  .refine((v) => isPossiblePhone(v), 'Enter a phone number with its area code, like (555) 010-4400.')
  .transform((v) => normalizePhone(v));

export const clientSchema = z.object({
  name: personName,
  email: z.union([z.literal(''), email]).default(''),
  phone: optionalPhone.default(''),
  altPhone: optionalPhone.default(''),
  notes: optionalText(4000).default(''),
  status: z.enum(CLIENT_STATUSES, { error: 'Choose active or cancelled.' }).default('active'),
});
export type ClientInput = z.input<typeof clientSchema>;
export type ClientValues = z.output<typeof clientSchema>;
export const clientPatchSchema = patchOf(clientSchema);

export const clientListQuery = listQuery.extend({
  status: z.enum(CLIENT_STATUSES, { error: 'Choose active or cancelled.' }).optional(),
});
