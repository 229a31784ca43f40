import { z } from 'zod';
import { INVITABLE_STAFF_ROLES } from '../roles';
import { email } from './common';

export const staffInvitationSchema = z.object({
  email,
  role: z.enum(INVITABLE_STAFF_ROLES, { error: 'Choose coordinator or technician.' }),
});
export type StaffInvitationInput = z.infer<typeof staffInvitationSchema>;

export const staffUpdateSchema = z
  .object({
    role: z.enum(INVITABLE_STAFF_ROLES, { error: 'Choose coordinator or technician.' }).optional(),
    active: z.boolean({ error: 'active is true or false.' }).optional(),
  })
  .refine((v) => v.role !== undefined || v.active !== undefined, {
    message: 'Send a role or active.',
    path: ['role'],
  });
export type StaffUpdateInput = z.infer<typeof staffUpdateSchema>;
