import { z } from 'zod';
import { isoDate, listQuery, optionalDate, optionalText, patchOf, timeZone, uuid } from './common';

const moneyCents = z.number({ error: 'Enter an amount in cents.' }).int('Use whole cents.').min(0, 'Cannot be negative.').max(10_000_000, 'That amount is too large.');

export const addressSchema = z.object({
  line1: z.string({ error: 'Enter the street address.' }).trim().min(1, 'Enter the street address.').max(200, 'Use at most 200 characters.'),
  line2: optionalText(200).default(''),
  city: z.string({ error: 'Enter the city.' }).trim().min(1, 'Enter the city.').max(100, 'Use at most 100 characters.'),
  region: optionalText(100).default(''),
  postalCode: optionalText(20).default(''),
  country: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{2}$/, 'Use the two-letter country code, like US.')
    .default('US'),
});

export const permitSchema = z.object({
  number: optionalText(60).default(''),
  authority: optionalText(120).default(''),
  expiresOn: optionalDate.default(null),
});

const contractFields = z.object({
    startsOn: optionalDate.default(null),
    termMonths: z.number({ error: 'Enter the term in months.' }).int().min(1, 'At least 1 month.').max(120, 'At most 120 months.').nullable().default(null),
    monthlyFeeCents: moneyCents.nullable().default(null),
    cancelledOn: optionalDate.default(null),
    cancelReason: optionalText(500).default(''),
});
export const contractSchema = contractFields.refine((c) => !c.cancelledOn || !c.startsOn || c.cancelledOn >= c.startsOn, {
    message: 'The contract cannot be cancelled before it starts.',
    path: ['cancelledOn'],
  });

export const siteSchema = z.object({
  clientId: uuid,
  name: z.string({ error: 'Name the site.' }).trim().min(1, 'Name the site, like “Home” or “Lake house”.').max(120, 'Use at most 120 characters.'),
  address: addressSchema,
  timeZone,
  latitude: z.number({ error: 'Latitude is a number.' }).min(-90, 'Between -90 and 90.').max(90, 'Between -90 and 90.').nullable().default(null),
  longitude: z.number({ error: 'Longitude is a number.' }).min(-180, 'Between -180 and 180.').max(180, 'Between -180 and 180.').nullable().default(null),
  monitoringAccount: z
    .string()
    .trim()
    .toUpperCase()
    .max(20, 'Use at most 20 characters.')
    .regex(/^[0-9A-Z-]*$/, 'Use digits and letters only.')
    .default(''),
  accessNotes: optionalText(2000).default(''),
  permit: permitSchema.default({ number: '', authority: '', expiresOn: null }),
  contract: contractSchema.default({ startsOn: null, termMonths: null, monthlyFeeCents: null, cancelledOn: null, cancelReason: '' }),
  /** write-only; null clears it */
  passcode: z.string().trim().min(1, 'Enter the passcode, or clear it.').max(32, 'Use at most 32 characters.').nullable().optional(),
});
export type SiteInput = z.input<typeof siteSchema>;
export type SiteValues = z.output<typeof siteSchema>;

const siteFields = siteSchema.omit({ clientId: true });
export const sitePatchSchema = patchOf(siteFields).extend({
  address: patchOf(addressSchema).optional(),
  permit: patchOf(permitSchema).optional(),
  contract: patchOf(contractFields).optional(),
});
export type SitePatch = z.output<typeof sitePatchSchema>;

export const siteListQuery = listQuery.extend({ clientId: uuid.optional() });

export { isoDate };
