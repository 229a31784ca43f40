import { z } from 'zod';
import { DEVICE_TYPES } from '../devices';

const years = (label: string) => z.number({ error: `${label} is a number of years.` }).min(1, 'At least 1 year.').max(15, 'At most 15 years.');

/**
 * A firm's upkeep settings (device-life model): the end-of-life periods, how early an item
 * counts as "soon", and per-device-type overrides. Saved whole; empty maps mean "our model".
 */
export const upkeepSettingsSchema = z.object({
  // NFPA 72: a household smoke alarm stays in service no more than 10 years from manufacture (references.md 4.4)
  smokeEndOfLifeYears: years('Smoke alarm life').int('Use whole years.').max(10, 'NFPA 72 allows a smoke alarm at most 10 years from manufacture.'),
  smokeDetectorEndOfLifeYears: years('System smoke detector life').int('Use whole years.').optional(),
  heatEndOfLifeYears: years('Heat alarm life').int('Use whole years.').optional(),
  coEndOfLifeYears: years('CO alarm life').int('Use whole years.'),
  usableCapacityFraction: z
    .number({ error: 'Usable share of battery capacity is a number between 0.5 and 1.' })
    .min(0.5, 'At least 0.5 (half the nominal capacity).')
    .max(1, 'At most 1 (the whole nominal capacity).')
    .optional(),
  soonDays: z.number({ error: 'Days ahead is a number.' }).int('Use whole days.').min(7, 'At least 7 days.').max(365, 'At most 365 days.'),
  batteryYearsOverride: z.partialRecord(
    z.enum(DEVICE_TYPES),
    z.number({ error: 'Battery life is a number of years.' }).min(0.5, 'At least half a year.').max(15, 'At most 15 years.'),
  ),
  averageCurrentMicroAmps: z.partialRecord(
    z.enum(DEVICE_TYPES),
    z.number({ error: 'Average current is a number of microamps.' }).positive('Must be above 0 µA.').max(10_000, 'At most 10,000 µA.'),
  ),
});
export type UpkeepSettingsInput = z.infer<typeof upkeepSettingsSchema>;
