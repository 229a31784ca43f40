import { z } from 'zod';
import { LIMITS } from '../limits';
import { email, password, personName } from './common';

export const signInSchema = z.object({
  email,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(LIMITS.passwordMax),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const signUpSchema = z.object({
  firmName: z
    .string({ error: 'Enter the firm name.' })
    .trim()
    .min(2, 'Enter the firm name.')
    .max(LIMITS.firmNameMax, `Use at most ${LIMITS.firmNameMax} characters.`),
  name: personName,
  email,
  password,
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const passwordResetRequestSchema = z.object({ email });
export const passwordResetSchema = z.object({ password });

export const acceptInvitationSchema = z.object({ name: personName, password });
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

export const tokenParams = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is not valid.'),
});
