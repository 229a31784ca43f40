import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { signInSchema, signUpSchema } from '@domain/schemas/auth';
import { listQuery } from '@domain/schemas/common';
import { firmSettingsPatchSchema, firmSettingsSchema } from '@domain/schemas/firm';
import { staffInvitationSchema, staffUpdateSchema } from '@domain/schemas/staff';
import { LIMITS } from '@domain/limits';

/** The issues of a failed parse as `{ path: message }`, for asserting which field is named. */
function fieldErrors(schema: z.ZodType, input: unknown): Record<string, string> {
  const result = schema.safeParse(input);
  expect(result.success, 'the input should have been refused').toBe(false);
  const out: Record<string, string> = {};
  for (const issue of result.error?.issues ?? []) out[issue.path.join('.')] ??= issue.message;
  return out;
}

describe('signUpSchema', () => {
  const valid = {
    firmName: 'Lanternfield Alarm Co.',
    name: 'Dana Whitlock',
    email: 'dana@lanternfield.example',
    password: 'correct horse battery',
  };

  it('accepts a complete sign-up', () => {
    expect(signUpSchema.parse(valid)).toEqual(valid);
  });

  it('trims and lower-cases the e-mail address, and trims the names', () => {
    const parsed = signUpSchema.parse({
      ...valid,
      email: '  Dana@Lanternfield.EXAMPLE ',
      firmName: '  Lanternfield Alarm Co.  ',
      name: ' Dana Whitlock ',
    });
    expect(parsed.email).toBe('dana@lanternfield.example');
    expect(parsed.firmName).toBe('Lanternfield Alarm Co.');
    expect(parsed.name).toBe('Dana Whitlock');
  });

  it('refuses a short password with a message naming the minimum', () => {
    const errors = fieldErrors(signUpSchema, { ...valid, password: 'short' });
    expect(Object.keys(errors)).toEqual(['password']);
    expect(errors.password).toBe(`Use at least ${LIMITS.passwordMin} characters.`);
    expect(errors.password).toContain('10');
  });

  it('accepts a password of exactly the minimum length', () => {
    expect(signUpSchema.safeParse({ ...valid, password: 'x'.repeat(LIMITS.passwordMin) }).success).toBe(true);
  });

  it('does not trim the password', () => {
    expect(signUpSchema.parse({ ...valid, password: '  spaced password  ' }).password).toBe('  spaced password  ');
  });

  it('refuses a blank firm name', () => {
    expect(fieldErrors(signUpSchema, { ...valid, firmName: '   ' })).toEqual({ firmName: 'Enter the firm name.' });
    expect(fieldErrors(signUpSchema, { ...valid, firmName: '' })).toEqual({ firmName: 'Enter the firm name.' });
  });

  it('refuses an overlong firm name', () => {
    expect(fieldErrors(signUpSchema, { ...valid, firmName: 'x'.repeat(LIMITS.firmNameMax + 1) })).toEqual({
      firmName: `Use at most ${LIMITS.firmNameMax} characters.`,
    });
  });

  it('refuses a malformed e-mail address, naming the field', () => {
    const errors = fieldErrors(signUpSchema, { ...valid, email: 'dana at lanternfield' });
    expect(Object.keys(errors)).toEqual(['email']);
    expect(errors.email).toMatch(/valid e-mail/);
  });

  it('names every missing field', () => {
    expect(Object.keys(fieldErrors(signUpSchema, {})).sort()).toEqual(['email', 'firmName', 'name', 'password']);
  });
});

describe('signInSchema', () => {
  it('normalises the e-mail address and asks for a password', () => {
    expect(signInSchema.parse({ email: ' A@B.EXAMPLE ', password: 'x' }).email).toBe('a@b.example');
    expect(fieldErrors(signInSchema, { email: 'a@b.example', password: '' })).toEqual({ password: 'Enter your password.' });
  });
});

describe('staffInvitationSchema', () => {
  it('invites a coordinator or a technician', () => {
    expect(staffInvitationSchema.parse({ email: ' Sam@Example.com', role: 'coordinator' })).toEqual({
      email: 'sam@example.com',
      role: 'coordinator',
    });
    expect(staffInvitationSchema.safeParse({ email: 'sam@example.com', role: 'technician' }).success).toBe(true);
  });

  it.each(['owner', 'operator', 'client', ''])('refuses role %j (not invitable as staff)', (role) => {
    expect(fieldErrors(staffInvitationSchema, { email: 'sam@example.com', role })).toEqual({
      role: 'Choose coordinator or technician.',
    });
  });
});

describe('staffUpdateSchema', () => {
  it('refuses an empty object', () => {
    expect(fieldErrors(staffUpdateSchema, {})).toEqual({ role: 'Send a role or active.' });
  });

  it('accepts a role change or a deactivation alone', () => {
    expect(staffUpdateSchema.parse({ role: 'technician' })).toEqual({ role: 'technician' });
    expect(staffUpdateSchema.parse({ active: false })).toEqual({ active: false });
    expect(staffUpdateSchema.parse({ role: 'coordinator', active: true })).toEqual({ role: 'coordinator', active: true });
  });

  it('refuses promotion to owner and a non-boolean active', () => {
    expect(fieldErrors(staffUpdateSchema, { role: 'owner' })).toEqual({ role: 'Choose coordinator or technician.' });
    expect(fieldErrors(staffUpdateSchema, { active: 'no' })).toEqual({ active: 'active is true or false.' });
  });
});

describe('firmSettingsSchema', () => {
  const valid = {
    name: 'Lanternfield Alarm Co.',
    shortName: 'lanternfield-alarm',
    timeZone: 'America/Chicago',
    licenceNumber: 'AL-20419',
    phone: '+1 (555) 010-2000',
    monitoringCenterName: 'Prairie Monitoring',
    monitoringCenterPhone: '+1 (555) 010-2030',
    accentColor: '#8f5c17',
  };

  it('accepts complete settings', () => {
    expect(firmSettingsSchema.parse(valid)).toEqual(valid);
  });

  it('trims and lower-cases the short name', () => {
    expect(firmSettingsSchema.parse({ ...valid, shortName: '  Lanternfield-Alarm ' }).shortName).toBe('lanternfield-alarm');
  });

  it('refuses a bad time zone at path timeZone', () => {
    expect(fieldErrors(firmSettingsSchema, { ...valid, timeZone: 'Mars/Olympus_Mons' })).toEqual({
      timeZone: 'Choose a time zone from the list, like America/Chicago.',
    });
  });

  it.each(['red', '#fff', '8f5c17', '#8f5c1g'])('refuses colour %j at path accentColor', (accentColor) => {
    expect(fieldErrors(firmSettingsSchema, { ...valid, accentColor })).toEqual({
      accentColor: 'Use a colour written as #rrggbb, like #8f5c17.',
    });
  });

  it.each(['lantern field', 'lantern--field', '-lantern', 'lantern-', 'lantern_field', 'läntern'])(
    'refuses short name %j at path shortName',
    (shortName) => {
      expect(fieldErrors(firmSettingsSchema, { ...valid, shortName })).toEqual({
        shortName: 'Use lowercase letters, digits and single hyphens, like lanternfield-alarm.',
      });
    },
  );

  it('refuses a short name that is too short or too long', () => {
    expect(fieldErrors(firmSettingsSchema, { ...valid, shortName: 'ab' })).toEqual({
      shortName: `Use at least ${LIMITS.shortNameMin} characters.`,
    });
    expect(fieldErrors(firmSettingsSchema, { ...valid, shortName: 'a'.repeat(LIMITS.shortNameMax + 1) })).toEqual({
      shortName: `Use at most ${LIMITS.shortNameMax} characters.`,
    });
  });

  it('refuses a phone number with letters at path monitoringCenterPhone', () => {
    expect(Object.keys(fieldErrors(firmSettingsSchema, { ...valid, monitoringCenterPhone: 'call us' }))).toEqual([
      'monitoringCenterPhone',
    ]);
  });

  it('names every bad field at once', () => {
    const errors = fieldErrors(firmSettingsSchema, { ...valid, timeZone: 'Nowhere', accentColor: 'blue', shortName: 'A B' });
    expect(Object.keys(errors).sort()).toEqual(['accentColor', 'shortName', 'timeZone']);
  });

  it('lets a patch carry only some fields but still checks them', () => {
    expect(firmSettingsPatchSchema.parse({})).toEqual({});
    expect(firmSettingsPatchSchema.parse({ accentColor: '#1f3a5f' })).toEqual({ accentColor: '#1f3a5f' });
    expect(Object.keys(fieldErrors(firmSettingsPatchSchema, { timeZone: 'Nowhere' }))).toEqual(['timeZone']);
  });
});

describe('listQuery', () => {
  it('defaults to page 1 of 25', () => {
    expect(listQuery.parse({})).toEqual({ page: 1, pageSize: 25 });
    expect(LIMITS.pageSizeDefault).toBe(25);
  });

  it('coerces query-string numbers', () => {
    const parsed = listQuery.parse({ page: '3', pageSize: '50' });
    expect(parsed.page).toBe(3);
    expect(parsed.pageSize).toBe(50);
    expect(typeof parsed.page).toBe('number');
  });

  it('accepts a page size of exactly 100 and refuses more', () => {
    expect(listQuery.parse({ pageSize: '100' }).pageSize).toBe(100);
    expect(fieldErrors(listQuery, { pageSize: '101' })).toEqual({ pageSize: 'pageSize is at most 100.' });
  });

  it('refuses page 0, fractions and words', () => {
    expect(fieldErrors(listQuery, { page: '0' })).toEqual({ page: 'page starts at 1.' });
    expect(Object.keys(fieldErrors(listQuery, { page: '1.5' }))).toEqual(['page']);
    expect(fieldErrors(listQuery, { page: 'two' })).toEqual({ page: 'page must be a number.' });
    expect(fieldErrors(listQuery, { pageSize: '0' })).toEqual({ pageSize: 'pageSize must be at least 1.' });
  });

  it('accepts a field name to sort by, with - for descending', () => {
    expect(listQuery.parse({ sort: 'name' }).sort).toBe('name');
    expect(listQuery.parse({ sort: '-createdAt' }).sort).toBe('-createdAt');
  });

  it.each(['name desc', 'name;drop', '--name', 'created_at', '', 'name,email'])('refuses sort %j', (sort) => {
    expect(fieldErrors(listQuery, { sort })).toEqual({
      sort: 'sort is a field name, with "-" in front for descending.',
    });
  });

  it('trims the search text and caps its length', () => {
    expect(listQuery.parse({ q: '  whitlock ' }).q).toBe('whitlock');
    expect(Object.keys(fieldErrors(listQuery, { q: 'x'.repeat(201) }))).toEqual(['q']);
  });
});
