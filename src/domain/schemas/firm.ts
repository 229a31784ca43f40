import { z } from 'zod';
import { LIMITS } from '../limits';
import { SHORT_NAME_PATTERN } from '../short-name';
import { hexColour, phone, timeZone } from './common';

export const firmSettingsSchema = z.object({
  name: z
    .string({ error: 'Enter the firm name.' })
    .trim()
    .min(2, 'Enter the firm name.')
    .max(LIMITS.firmNameMax, `Use at most ${LIMITS.firmNameMax} characters.`),
  shortName: z
    .string({ error: 'Enter a short name.' })
    .trim()
    .toLowerCase()
    .min(LIMITS.shortNameMin, `Use at least ${LIMITS.shortNameMin} characters.`)
    .max(LIMITS.shortNameMax, `Use at most ${LIMITS.shortNameMax} characters.`)
    .regex(SHORT_NAME_PATTERN, 'Use lowercase letters, digits and single hyphens, like lanternfield-alarm.'),
  timeZone,
  phone,
  licenceNumber: z.string().trim().max(LIMITS.licenceMax, `Use at most ${LIMITS.licenceMax} characters.`),
  monitoringCenterName: z.string().trim().max(LIMITS.nameMax, `Use at most ${LIMITS.nameMax} characters.`),
  monitoringCenterPhone: phone,
  accentColor: hexColour,
});
export type FirmSettingsInput = z.infer<typeof firmSettingsSchema>;
export const firmSettingsPatchSchema = firmSettingsSchema.partial();

export const operatorActionSchema = z.object({
  reason: z
    .string({ error: 'Give a reason.' })
    .trim()
    .min(3, 'Give a reason the firm owner will understand.')
    .max(LIMITS.reasonMax, `Use at most ${LIMITS.reasonMax} characters.`),
});
