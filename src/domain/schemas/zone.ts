import { z } from 'zod';
import { DEVICE_TYPES, ZONE_STATUSES, ZONE_TYPES } from '../devices';
import { optionalDate, patchOf, uuid } from './common';

const booleanField = (label: string) => z.boolean({ error: `${label} is on or off.` });

/** Serial numbers are strings: leading zeros matter. */
export const serialSchema = z
  .string({ error: 'Enter the serial as printed on the device.' })
  .trim()
  .max(20, 'Use at most 20 characters.')
  .regex(/^[0-9A-Za-z-]*$/, 'Use the digits and letters printed on the device.');

const zoneFields = z.object({
  number: z.number({ error: 'Zone number is a number.' }).int('Use a whole number.').min(1, 'Zone numbers start at 1.').max(999, 'At most 999.'),
  description: z
    .string({ error: 'Describe the zone.' })
    .trim()
    .min(1, 'Describe the zone the way the household says it, like “Front door”.')
    .max(40, 'Use at most 40 characters: keypads show short descriptions.'),
  deviceType: z.enum(DEVICE_TYPES, { error: 'Choose the device type.' }),
  zoneType: z.enum(ZONE_TYPES, { error: 'Choose the zone type.' }),
  serial: serialSchema.default(''),
  input: z.number({ error: 'Input is a number.' }).int().min(1, 'Inputs start at 1.').max(8, 'At most input 8.').default(1),
  reportsToMonitoring: booleanField('Reports to the monitoring center'),
  chime: booleanField('Chime'),
  supervised: booleanField('Supervised'),
  status: z.enum(ZONE_STATUSES, { error: 'Choose in service, bypassed or removed.' }).default('active'),
  roomId: uuid.nullable().default(null),
  openingId: uuid.nullable().default(null),
  installedOn: optionalDate.default(null),
  batteryType: z
    .preprocess((v) => (v === '' ? null : v), z.string().trim().max(30, 'Use at most 30 characters.').nullable())
    .default(null),
  batteryChangedOn: optionalDate.default(null),
  manufacturedOn: optionalDate.default(null),
});

/**
 * Creating a zone: the number may be left out (the next free wireless number is taken) and
 * the behaviour fields may be left out (the device type's defaults are used).
 */
export const zoneCreateSchema = zoneFields.extend({
  number: zoneFields.shape.number.optional(),
  zoneType: zoneFields.shape.zoneType.optional(),
  reportsToMonitoring: zoneFields.shape.reportsToMonitoring.optional(),
  chime: zoneFields.shape.chime.optional(),
  supervised: zoneFields.shape.supervised.optional(),
});
export type ZoneCreateInput = z.input<typeof zoneCreateSchema>;
export const zoneSchema = zoneFields;
export type ZoneValues = z.output<typeof zoneFields>;
export const zonePatchSchema = patchOf(zoneFields);

/** The CSV columns of a zone list (api-resources.md: the same names as the JSON fields). */
export const ZONE_CSV_COLUMNS = [
  'number',
  'description',
  'deviceType',
  'zoneType',
  'serial',
  'input',
  'reportsToMonitoring',
  'chime',
  'supervised',
  'status',
  'installedOn',
  'batteryType',
  'batteryChangedOn',
  'manufacturedOn',
] as const;
