/**
 * Port choice for `npm start`: the usual port when free, otherwise a free one, and the mail
 * catcher and the Stripe stand-in really serving on the port they report. Each test holds an
 * ephemeral port as the "usual" one, so no test needs (or fights over) 1025, 1080 or 12111.
 */
import net from 'node:net';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { isPortFree, pickPort, pickPorts } from '@server/ports';
import { startMailCatcher } from '@server/fakes/mail-catcher';
import { startLocalBilling } from '@server/billing/setup';
import { createSmtpMailer } from '@server/emails/mailer';

const held: net.Server[] = [];
const cleanups: (() => Promise<void>)[] = [];

/** Something already listening, as another `npm start` would be. */
async function occupy(host = '127.0.0.1'): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, host, resolve));
  held.push(server);
  return (server.address() as net.AddressInfo).port;
}

/** A port nothing listens on right now. */
async function vacant(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/** Fails unless port can be listened on at 127.0.0.1. */
async function listenable(port: number): Promise<void> {
  const server = net.createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  await new Promise<void>((resolve) => server.close(() => resolve()));
}

afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup();
  await Promise.all(held.splice(0).map((s) => new Promise<void>((resolve) => s.close(() => resolve()))));
});

describe('pickPort', () => {
  it('keeps the preferred port when it is free', async () => {
    const port = await vacant();
    expect(await pickPort(port)).toBe(port);
  });

  it('picks another, usable port when the preferred one is taken', async () => {
    const usual = await occupy();
    const picked = await pickPort(usual);
    expect(picked).not.toBe(usual);
    expect(picked).toBeGreaterThan(0);
    await listenable(picked);
  });

  it('gives different ports for several wishes, even the same one twice', async () => {
    const port = await vacant();
    const [first, second] = await pickPorts([port, port]);
    expect(first).toBe(port);
    expect(second).not.toBe(port);
  });

  it('sees a port taken on the loopback as taken for every interface, and the other way round', async () => {
    const onLoopback = await occupy('127.0.0.1');
    expect(await isPortFree(onLoopback, '0.0.0.0')).toBe(false);
    expect(await isPortFree(onLoopback, '127.0.0.1')).toBe(false);
    const onAll = await occupy('0.0.0.0');
    expect(await isPortFree(onAll, '127.0.0.1')).toBe(false);
    expect(await isPortFree(await vacant(), '127.0.0.1')).toBe(true);
  });
});

describe('the stand-ins when their usual ports are taken', () => {
  it('the mail catcher moves to free ports and receives mail at the URLs it reports', async () => {
    const usualSmtp = await occupy();
    const usualWeb = await occupy();
    const mail = await startMailCatcher({ smtpPort: usualSmtp, webPort: usualWeb });
    cleanups.push(() => mail.close());

    expect(mail.smtpPort).not.toBe(usualSmtp);
    expect(mail.webPort).not.toBe(usualWeb);
    expect(mail.smtpUrl).toBe(`smtp://127.0.0.1:${mail.smtpPort}`);
    expect(mail.webUrl).toBe(`http://127.0.0.1:${mail.webPort}`);

    await createSmtpMailer(mail.smtpUrl, 'Mullion <no-reply@mullion.test>').send({
      to: 'owner@firm.test',
      subject: 'Port check 5521',
      text: 'Hello',
      html: '<p>Hello</p>',
    });
    // maildev stores a message just after accepting it: ask its REST API until it lists it
    await vi.waitFor(async () => {
      const inbox = (await (await fetch(`${mail.webUrl}/api/email`)).json()) as { subject: string }[];
      expect(inbox.map((m) => m.subject)).toContain('Port check 5521');
    });
  });

  it('the mail catcher keeps its preferred ports when they are free', async () => {
    const [smtpPort, webPort] = (await pickPorts([0, 0])) as [number, number];
    const mail = await startMailCatcher({ smtpPort, webPort });
    cleanups.push(() => mail.close());
    expect([mail.smtpPort, mail.webPort]).toEqual([smtpPort, webPort]);
  });

  it('the Stripe stand-in moves to a free port and the SDK follows it', async () => {
    const usual = await occupy();
    // resolving the price ids is an SDK call: it only succeeds when the SDK reaches the stand-in
    const { billing, standIn } = await startLocalBilling({ appUrl: 'http://127.0.0.1:3999', port: usual });
    cleanups.push(() => standIn.close());

    expect(standIn.port).not.toBe(usual);
    expect(standIn.url).toBe(`http://127.0.0.1:${standIn.port}`);
    expect(Object.keys(billing.priceIds).length).toBeGreaterThan(0);
    const customer = await billing.stripe.customers.create({ email: 'owner@firm.test' });
    expect(customer.id).toMatch(/^cus_/);
  });
});
