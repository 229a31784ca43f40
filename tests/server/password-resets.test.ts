import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { PasswordReset } from '@server/models/PasswordReset';
import { User } from '@server/models/User';
import { createTestApp, linkFromMail, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let realNow: Date;
beforeAll(async () => {
  t = await createTestApp();
  realNow = t.clock.now;
});
afterEach(() => {
  t.clock.now = realNow;
});
afterAll(async () => {
  await t.close();
});

const NEW_PASSWORD = 'a brand new password';
const MINUTE_MS = 60_000;

function mailsTo(email: string) {
  return t.outbox.filter((m) => m.to === email);
}

/** Asks for a reset for this address and returns the reset path under /api. */
async function requestReset(email: string): Promise<string> {
  const v = await visitor(t.app);
  const res = await v.post('/api/password-resets', { email });
  expect(res.status).toBe(202);
  await t.flushMail();
  const link = linkFromMail(t.outbox, email, '/reset-password/');
  return `/api/password-resets/${link.split('/').pop()!}`;
}

describe('POST /api/password-resets', () => {
  it('answers 202 for a known address and e-mails it a reset link', async () => {
    const { technician } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const res = await v.post('/api/password-resets', { email: technician.email.toUpperCase() });
    expect(res.status).toBe(202);
    await t.flushMail();
    const mails = mailsTo(technician.email);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.text).toMatch(/http:\/\/mullion\.test\/reset-password\/[A-Za-z0-9_-]{20,}/);
    expect(mails[0]!.text).toContain('60 minutes');
    const stored = await PasswordReset.findAll({ where: { userId: technician.id } });
    expect(stored).toHaveLength(1);
    expect(mails[0]!.text).not.toContain(stored[0]!.tokenHash);
  });

  it('answers the same 202 for an unknown address and sends nothing', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const before = t.outbox.length;
    const unknown = await v.post('/api/password-resets', { email: 'nobody-here@test.example' });
    const known = await v.post('/api/password-resets', { email: owner.email });
    expect(unknown.status).toBe(202);
    expect(known.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    await t.flushMail();
    expect(mailsTo('nobody-here@test.example')).toHaveLength(0);
    expect(t.outbox.length).toBe(before + 1);
  });

  it('sends nothing to a deactivated sign-in, still answering 202', async () => {
    const { firm } = await buildFirmWithStaff();
    const gone = await buildUser(firm, 'technician', { deactivatedAt: new Date() });
    const v = await visitor(t.app);
    expect((await v.post('/api/password-resets', { email: gone.email })).status).toBe(202);
    await t.flushMail();
    expect(mailsTo(gone.email)).toHaveLength(0);
  });

  it('works for an operator, who has no firm', async () => {
    const operator = await buildUser(null, 'operator');
    const path = await requestReset(operator.email);
    const v = await visitor(t.app);
    expect((await v.post(path, { password: NEW_PASSWORD })).status).toBe(200);
    expect((await (await visitor(t.app)).signIn(operator.email, NEW_PASSWORD)).status).toBe(200);
  });

  it('answers 400 naming email for a malformed address', async () => {
    const v = await visitor(t.app);
    const res = await v.post('/api/password-resets', { email: 'not an address' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['email']);
  });
});

describe('POST /api/password-resets/:token', () => {
  it('sets the new password: sign-in works with the new one, not the old', async () => {
    const { firm, coordinator } = await buildFirmWithStaff();
    const path = await requestReset(coordinator.email);
    const v = await visitor(t.app);
    const res = await v.post(path, { password: NEW_PASSWORD });
    expect(res.status).toBe(200);

    const withOld = await (await visitor(t.app)).signIn(coordinator.email, TEST_PASSWORD);
    expect(withOld.status).toBe(401);
    const withNew = await (await visitor(t.app)).signIn(coordinator.email, NEW_PASSWORD);
    expect(withNew.status).toBe(200);
    expect(withNew.body.data.user.id).toBe(coordinator.id);

    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, action: 'password.reset' } });
    expect(audit.map((a) => a.subjectId)).toEqual([coordinator.id]);
  });

  it('refuses the same link a second time and keeps the first new password', async () => {
    const { technician } = await buildFirmWithStaff();
    const path = await requestReset(technician.email);
    const v = await visitor(t.app);
    await v.post(path, { password: NEW_PASSWORD }).expect(200);
    const again = await v.post(path, { password: 'a third password here' });
    expect(again.status).toBe(404);
    expect(again.body.error.code).toBe('not_found');
    expect(again.body.error.message).toMatch(/no longer valid/);
    expect((await (await visitor(t.app)).signIn(technician.email, 'a third password here')).status).toBe(401);
    expect((await (await visitor(t.app)).signIn(technician.email, NEW_PASSWORD)).status).toBe(200);
  });

  it('refuses an expired link (older than 60 minutes) and keeps the old password', async () => {
    const { technician } = await buildFirmWithStaff();
    const path = await requestReset(technician.email);
    t.clock.now = new Date(realNow.getTime() + 61 * MINUTE_MS);
    const v = await visitor(t.app);
    const res = await v.post(path, { password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/no longer valid/);
    t.clock.now = realNow;
    expect((await (await visitor(t.app)).signIn(technician.email, TEST_PASSWORD)).status).toBe(200);
    expect((await (await visitor(t.app)).signIn(technician.email, NEW_PASSWORD)).status).toBe(401);
  });

  it('still accepts a link just inside the 60 minutes', async () => {
    const { technician } = await buildFirmWithStaff();
    const path = await requestReset(technician.email);
    t.clock.now = new Date(realNow.getTime() + 59 * MINUTE_MS);
    const v = await visitor(t.app);
    expect((await v.post(path, { password: NEW_PASSWORD })).status).toBe(200);
  });

  it('refuses a link that was never issued (404) and a malformed one (400)', async () => {
    const v = await visitor(t.app);
    const unknown = await v.post(`/api/password-resets/${'b'.repeat(43)}`, { password: NEW_PASSWORD });
    expect(unknown.status).toBe(404);
    const malformed = await v.post('/api/password-resets/abc', { password: NEW_PASSWORD });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('token');
  });

  it('answers 400 naming password for a short password, and the link stays usable', async () => {
    const { technician } = await buildFirmWithStaff();
    const path = await requestReset(technician.email);
    const v = await visitor(t.app);
    const res = await v.post(path, { password: 'short' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['password']);
    expect((await v.post(path, { password: NEW_PASSWORD })).status).toBe(200);
  });

  it('ends the user’s other sessions, and leaves other people signed in', async () => {
    const { owner, technician } = await buildFirmWithStaff();
    const phone = await visitor(t.app);
    const laptop = await visitor(t.app);
    const colleague = await visitor(t.app);
    await phone.signIn(technician.email, TEST_PASSWORD);
    await laptop.signIn(technician.email, TEST_PASSWORD);
    await colleague.signIn(owner.email, TEST_PASSWORD);
    expect((await phone.get('/api/staff')).status).toBe(200);
    expect((await laptop.get('/api/session')).body.user.id).toBe(technician.id);

    const path = await requestReset(technician.email);
    await (await visitor(t.app)).post(path, { password: NEW_PASSWORD }).expect(200);

    expect((await phone.get('/api/staff')).status).toBe(401);
    expect((await laptop.get('/api/session')).body.user).toBeNull();
    expect((await colleague.get('/api/session')).body.user.id).toBe(owner.id);
    expect((await colleague.get('/api/staff')).status).toBe(200);
  });

  it('refuses a reset for a person deactivated after asking', async () => {
    const { firm, technician } = await buildFirmWithStaff();
    const path = await requestReset(technician.email);
    await User.update({ deactivatedAt: new Date() }, { where: { tenantId: firm.id, id: technician.id } });
    const res = await (await visitor(t.app)).post(path, { password: NEW_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('user_deactivated');
  });
});
