import { z } from 'zod';
import { LIMITS } from '../limits';
import { isValidTimeZone } from '../time-zones';
import { isHexColour } from '../colour';

export const email = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail address.')
  .max(LIMITS.emailMax, `Use at most ${LIMITS.emailMax} characters.`)
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const password = z
  .string({ error: 'Enter a password.' })
  .min(LIMITS.passwordMin, `Use at least ${LIMITS.passwordMin} characters.`)
  .max(LIMITS.passwordMax, `Use at most ${LIMITS.passwordMax} characters.`);

export const personName = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(LIMITS.nameMax, `Use at most ${LIMITS.nameMax} characters.`);

export const uuid = z.uuid({ error: 'Not a valid id.' });

export const timeZone = z
  .string({ error: 'Choose a time zone.' })
  .refine(isValidTimeZone, 'Choose a time zone from the list, like America/Chicago.');

export const hexColour = z
  .string()
  .refine(isHexColour, 'Use a colour written as #rrggbb, like #8f5c17.');

export const phone = z
  .string()
  .trim()
  .max(LIMITS.phoneMax, `Use at most ${LIMITS.phoneMax} characters.`)
  .regex(/^[0-9+()\-.\s]*$/, 'Use digits, spaces and + ( ) - only.');

/** `?page=&pageSize=&sort=&q=` of every list (architecture.md). */
export const listQuery = z.object({
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, 'page starts at 1.').default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize must be a number.' })
    .int()
    .min(1, 'pageSize must be at least 1.')
    .max(LIMITS.pageSizeMax, `pageSize is at most ${LIMITS.pageSizeMax}.`)
    .default(LIMITS.pageSizeDefault),
  sort: z
    .string()
    .regex(/^-?[a-zA-Z]+$/, 'sort is a field name, with "-" in front for descending.')
    .optional(),
  q: z.string().trim().max(200).optional(),
});
export type ListQuery = z.infer<typeof listQuery>;

/** A calendar date written YYYY-MM-DD (the API's `…On` fields). */
export const isoDate = z
  .string({ error: 'Enter a date as YYYY-MM-DD.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter a date as YYYY-MM-DD.')
  .refine((v) => {
    const d = new Date(`${v}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
  }, 'That date does not exist.');

/** An optional date: empty string and null both mean "no date". */
export const optionalDate = z.preprocess((v) => (v === '' ? null : v), isoDate.nullable());

/** Optional free text: trimmed, at most `max` characters, empty allowed. */
export function optionalText(max: number) {
  return z
    .string({ error: 'Enter text.' })
    .trim()
    .max(max, `Use at most ${max} characters.`);
}

type Undefaulted<S> = S extends z.ZodDefault<infer Inner> ? Inner : S;
type PatchShape<T extends z.ZodRawShape> = { [K in keyof T]: z.ZodOptional<Undefaulted<T[K]>> };

/**
 * The PATCH form of an object schema: every field optional and no defaults, so a field
 * left out stays as it is (zod's `.partial()` would still fill defaults in).
 */
export function patchOf<T extends z.ZodRawShape>(schema: z.ZodObject<T>): z.ZodObject<PatchShape<T>> {
  const shape: Record<string, z.ZodType> = {};
  for (const [key, field] of Object.entries(schema.shape)) {
    const inner = field instanceof z.ZodDefault ? (field.unwrap() as z.ZodType) : (field as z.ZodType);
    shape[key] = inner.optional();
  }
  return z.object(shape) as unknown as z.ZodObject<PatchShape<T>>;
}
