/**
 * Limits on everything that sends e-mail: per acting user and per recipient, counted within
 * one firm. Over a limit → 429 `rate_limited` with a message naming what was limited, and
 * nothing saved.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation } from '@server/models/Invitation';
import { Job } from '@server/models/Job';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFirmWithStaff, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const mailsTo = (email: string) => t.outbox.filter((m) => m.to === email);

describe('invitations to one address', () => {
  it('an invitation and two re-sends go out; the third re-send is 429 rate_limited naming the address, and sends nothing', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = 'outside-person@test.example';
    const invited = await v.post('/api/staff/invitations', { email, role: 'technician' });
    expect(invited.status).toBe(201);
    const id = (invited.body as { data: { id: string } }).data.id;
    for (let i = 0; i < 2; i++) expect((await v.post(`/api/staff/invitations/${id}/resend`)).status).toBeLessThan(300);
    const refused = await v.post(`/api/staff/invitations/${id}/resend`);
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(refused.body.error.message).toContain(email);
    expect(mailsTo(email)).toHaveLength(3);

    // another firm's allowance for the same address is its own
    const other = await buildFirmWithStaff();
    const w = await signedIn(other.owner);
    expect((await w.post('/api/staff/invitations', { email, role: 'technician' })).status).toBe(201);
    expect(mailsTo(email)).toHaveLength(4);
    expect(await Invitation.count({ where: { tenantId: other.firm.id, email } })).toBe(1);
  });
});

describe('service requests from one household', () => {
  it('five an hour reach the coordinator; the sixth is 429 and makes no job and no e-mail', async () => {
    const f = await buildFirmWithSite();
    const v = await signedIn(f.clientUser);
    const ask = () => v.post(`/api/portal/sites/${f.site.id}/service-requests`, { description: 'The keypad beeps.', preferredTimes: 'Mornings' });
    for (let i = 0; i < 5; i++) expect((await ask()).status).toBe(201);
    const refused = await ask();
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(refused.body.error.message).toMatch(/service requests/);
    expect(mailsTo(f.coordinator.email)).toHaveLength(5);
    expect(await Job.count({ where: { tenantId: f.firm.id, requestedByClient: true } })).toBe(5);

    // a household of another firm is not held back by this one
    const g = await buildFirmWithSite();
    const w = await signedIn(g.clientUser);
    expect((await w.post(`/api/portal/sites/${g.site.id}/service-requests`, { description: 'A door sensor.', preferredTimes: 'Any' })).status).toBe(201);
  });
});

describe('emergency-contact changes from one household', () => {
  it('ten saves an hour; the eleventh is 429 and changes nothing', async () => {
    const f = await buildFirmWithSite();
    const v = await signedIn(f.clientUser);
    const save = (i: number) => v.put(`/api/portal/sites/${f.site.id}/contacts`, { contacts: [{ name: `Neighbour ${i}`, relation: 'Neighbour', phone: '+15550104500' }] });
    for (let i = 1; i <= 10; i++) expect((await save(i)).status, `save ${i}`).toBe(200);
    const refused = await save(11);
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(refused.body.error.message).toMatch(/emergency contacts/);
    expect(mailsTo(f.owner.email)).toHaveLength(10);
    const list = await v.get(`/api/portal/sites/${f.site.id}/contacts`);
    expect(JSON.stringify(list.body)).toContain('Neighbour 10');
    expect(JSON.stringify(list.body)).not.toContain('Neighbour 11');
  });
});
