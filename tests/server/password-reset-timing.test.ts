/**
 * A password-reset request answers before any account work: the answer cannot depend on
 * whether the address has an account, in body or in timing. Proved with a gate that holds
 * the background work: the 202 arrives while no token and no e-mail exist yet.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BackgroundTasks } from '@server/background-tasks';
import { PasswordReset } from '@server/models/PasswordReset';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithStaff } from '../support/factories';

/** Background work that waits until the test opens the gate. */
function gatedBackground(): BackgroundTasks & { open(): void; held(): number } {
  const waiting: (() => Promise<void>)[] = [];
  const running: Promise<void>[] = [];
  return {
    run(_name, task) {
      waiting.push(task);
    },
    open() {
      for (const task of waiting.splice(0)) running.push(task());
    },
    held: () => waiting.length,
    async idle() {
      await Promise.all(running);
    },
  };
}

let t: TestApp;
let gate: ReturnType<typeof gatedBackground>;
beforeAll(async () => {
  gate = gatedBackground();
  t = await createTestApp({ background: gate });
});
afterAll(async () => {
  gate.open();
  await t.close();
});

describe('POST /api/password-resets answers before the account work', () => {
  it('answers 202 with the same body for a known and an unknown address while the work is still held back', async () => {
    const { technician } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const known = await v.post('/api/password-resets', { email: technician.email });
    const unknown = await v.post('/api/password-resets', { email: 'nobody-at-all@test.example' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    // answered, yet nothing has been looked up or made
    expect(gate.held()).toBe(2);
    expect(await PasswordReset.count({ where: { userId: technician.id } })).toBe(0);
    expect(t.outbox.filter((m) => m.to === technician.email)).toHaveLength(0);

    gate.open();
    await t.flushMail();
    expect(await PasswordReset.count({ where: { userId: technician.id } })).toBe(1);
    expect(t.outbox.filter((m) => m.to === technician.email)).toHaveLength(1);
    expect(t.outbox.filter((m) => m.to === 'nobody-at-all@test.example')).toHaveLength(0);
  });

  it('makes at most 3 reset e-mails an hour for one address, answering the same 202 each time', async () => {
    const { coordinator } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const answers = [];
    for (let i = 0; i < 5; i++) {
      answers.push(await v.post('/api/password-resets', { email: coordinator.email }));
      gate.open();
      await t.flushMail();
    }
    expect(answers.map((a) => a.status)).toEqual([202, 202, 202, 202, 202]);
    expect(new Set(answers.map((a) => JSON.stringify(a.body))).size).toBe(1);
    expect(t.outbox.filter((m) => m.to === coordinator.email)).toHaveLength(3);
  });
});
