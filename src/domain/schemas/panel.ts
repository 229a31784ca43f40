import { z } from 'zod';
import { COMM_PATHS } from '../devices';
import { PANEL_OCCUPANCIES } from '../panel-power';
import { optionalDate, patchOf } from './common';

const seconds = (label: string, max: number) =>
  z.number({ error: `${label} is a number of seconds.` }).int('Use whole seconds.').min(0, 'Cannot be negative.').max(max, `At most ${max} seconds.`);

/**
 * The panel's false-alarm-reduction settings. The form accepts what a panel can hold; the
 * CP-01 audit (cp01.ts) then says which values fall outside the standard.
 */
export const panelSettingsSchema = z.object({
  exitDelaySec: seconds('Exit delay', 600),
  entryDelaySec: seconds('Entry delay', 600),
  entryDelay2Sec: seconds('Second entry delay', 600),
  abortWindowSec: seconds('Abort window', 120),
  swingerLimit: z.number({ error: 'Swinger limit is a number of trips.' }).int().min(0, 'Cannot be negative.').max(15, 'At most 15 trips.'),
  cancelWindowMin: z.number({ error: 'Cancel window is a number of minutes.' }).int().min(0, 'Cannot be negative.').max(60, 'At most 60 minutes.'),
  exitRestart: z.boolean({ error: 'Exit-time restart is on or off.' }),
  autoStay: z.boolean({ error: 'Auto-stay is on or off.' }),
  crossZoning: z.boolean({ error: 'Cross zoning is on or off.' }),
  crossZoneWindowSec: seconds('Cross-zone window', 600),
  duress: z.boolean({ error: 'Duress code is on or off.' }),
});
export type PanelSettings = z.infer<typeof panelSettingsSchema>;

const zoneNumber = (label: string) => z.number({ error: `${label} is a number.` }).int('Use a whole number.').min(1, 'Zone numbers start at 1.').max(999, 'At most 999.');

const panelFields = z.object({
  label: z.string({ error: 'Name the panel.' }).trim().min(1, 'Name the panel, like “Main panel”.').max(60, 'Use at most 60 characters.'),
  makeModel: z.string().trim().max(120, 'Use at most 120 characters.').default(''),
  zoneCapacity: z.number({ error: 'Zone capacity is a number.' }).int().min(1, 'At least 1 zone.').max(999, 'At most 999 zones.'),
  wirelessZoneFrom: zoneNumber('First wireless zone'),
  wirelessZoneTo: zoneNumber('Last wireless zone'),
  commPath: z.enum(COMM_PATHS, { error: 'Choose how the panel reports: cellular, IP, phone line or a combination.' }),
  installedOn: optionalDate.default(null),
  occupancy: z.enum(PANEL_OCCUPANCIES, { error: 'Choose home or business.' }).default('household'),
  standbyCurrentMa: z
    .number({ error: 'Standby current is a number of milliamps.' })
    .min(0, 'Cannot be negative.')
    .max(10_000, 'At most 10,000 mA.')
    .nullable()
    .default(null),
  alarmCurrentMa: z
    .number({ error: 'Alarm current is a number of milliamps.' })
    .min(0, 'Cannot be negative.')
    .max(20_000, 'At most 20,000 mA.')
    .nullable()
    .default(null),
  batteryAh: z.number({ error: 'Battery size is a number of amp-hours.' }).positive('Must be above 0 Ah.').max(200, 'At most 200 Ah.').nullable().default(null),
  batteryManufacturedOn: optionalDate.default(null),
  pathFailureReportMin: z
    .number({ error: 'Minutes until a path failure is reported is a number.' })
    .int('Use whole minutes.')
    .min(0, 'Cannot be negative.')
    .max(10_080, 'At most a week (10,080 minutes).')
    .nullable()
    .default(null),
});

function checkRange(p: { zoneCapacity?: number | undefined; wirelessZoneFrom?: number | undefined; wirelessZoneTo?: number | undefined }, ctx: z.RefinementCtx) {
  if (p.wirelessZoneFrom !== undefined && p.wirelessZoneTo !== undefined && p.wirelessZoneFrom > p.wirelessZoneTo)
    ctx.addIssue({ code: 'custom', path: ['wirelessZoneTo'], message: 'The last wireless zone must not come before the first.' });
  if (p.zoneCapacity !== undefined && p.wirelessZoneTo !== undefined && p.wirelessZoneTo > p.zoneCapacity)
    ctx.addIssue({ code: 'custom', path: ['wirelessZoneTo'], message: `The panel holds ${p.zoneCapacity} zones; the wireless range must end at ${p.zoneCapacity} or below.` });
}

export const panelSchema = panelFields.extend({ settings: panelSettingsSchema.optional() }).superRefine(checkRange);
export type PanelInput = z.input<typeof panelSchema>;
export const panelPatchSchema = patchOf(panelFields)
  .extend({ settings: panelSettingsSchema.partial().optional() })
  .superRefine(checkRange);
