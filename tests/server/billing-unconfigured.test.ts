/**
 * A Mullion without Stripe configured (no STRIPE_SECRET_KEY, no stand-in): the billing page
 * still answers with the plan and usage, while anything that needs Stripe answers 503 with
 * a message saying payments are not set up, and changes nothing.
 */
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PLAN_KEYS } from '@domain/plans';
import { StripeEvent } from '@server/models/StripeEvent';
import { buildClientUser, buildFirmWithSite, buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';
import { signedEvent, TEST_WEBHOOK_SECRET } from '../support/stripe';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function owner(): Promise<{ v: Visitor; firm: Awaited<ReturnType<typeof buildFirmWithStaff>>['firm'] }> {
  const staff = await buildFirmWithStaff();
  const v = await visitor(t.app);
  expect((await v.signIn(staff.owner.email, TEST_PASSWORD)).status).toBe(200);
  return { v, firm: staff.firm };
}

describe('billing without Stripe configured', () => {
  it('GET /api/billing answers 200 with the plan, usage and catalogue, and paymentsConfigured false', async () => {
    const { v } = await owner();
    const res = await v.get('/api/billing');
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      state: 'trialing',
      planKey: null,
      paymentsConfigured: false,
      hasSubscription: false,
      readOnly: null,
      usage: { activeSites: 0, staffSeats: 3 },
      limits: { onTrial: true },
    });
    expect((res.body.data.plans as Array<{ key: string }>).map((p) => p.key)).toEqual([...PLAN_KEYS]);
  });

  it('POST /api/billing/checkout and /portal answer 503 saying payments are not set up; nothing changes', async () => {
    const { v, firm } = await owner();
    const checkout = await v.post('/api/billing/checkout', { planKey: 'crew' });
    expect(checkout.status).toBe(503);
    expect(checkout.body.error).toMatchObject({ code: 'service_unavailable' });
    expect(checkout.body.error.message).toMatch(/Payments are not set up/);

    const portal = await v.post('/api/billing/portal');
    expect(portal.status).toBe(503);
    expect(portal.body.error.message).toMatch(/Payments are not set up/);

    // a firm without a Stripe customer simply has no invoices yet
    const invoices = await v.get('/api/billing/invoices');
    expect(invoices.status).toBe(200);
    expect(invoices.body.data).toEqual([]);

    await firm.reload();
    expect(firm).toMatchObject({ state: 'trialing', planKey: null, stripeCustomerId: null });
  });

  it('still validates the plan first (400)', async () => {
    const { v } = await owner();
    const res = await v.post('/api/billing/checkout', { planKey: 'platinum' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('planKey');
  });

  it('POST /api/webhooks/stripe answers 503, even when correctly signed, and records nothing', async () => {
    const event = {
      id: 'evt_unconfigured_0001',
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: 'in_unconfigured', object: 'invoice', customer: 'cus_unconfigured' } },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type: 'invoice.payment_failed',
    };
    const { body, signature } = signedEvent(event, TEST_WEBHOOK_SECRET);
    const res = await request(t.app).post('/api/webhooks/stripe').set('Content-Type', 'application/json').set('Stripe-Signature', signature).send(body);
    expect(res.status).toBe(503);
    expect(res.body.error).toMatchObject({ code: 'service_unavailable', message: expect.stringMatching(/Payments are not set up/) as string });
    expect(await StripeEvent.findByPk(event.id)).toBeNull();
  });
});

describe('GET /api/operator/tenants/:tenantId/invoices', () => {
  async function as(user: { email: string }): Promise<Visitor> {
    const v = await visitor(t.app);
    expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
    return v;
  }

  it('the operator gets an empty list without Stripe; unknown firm 404; bad id 400; signed out 401', async () => {
    const f = await buildFirmWithSite();
    const operator = await as(await buildUser(null, 'operator'));
    const res = await operator.get(`/api/operator/tenants/${f.firm.id}/invoices`);
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual([]);
    expect((await operator.get('/api/operator/tenants/00000000-0000-4000-8000-000000000000/invoices')).status).toBe(404);
    const bad = await operator.get('/api/operator/tenants/not-an-id/invoices');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('tenantId');
    expect((await (await visitor(t.app)).get(`/api/operator/tenants/${f.firm.id}/invoices`)).status).toBe(401);
  });

  it('every firm role, and a household, gets 403 — for their own firm too', async () => {
    const f = await buildFirmWithSite();
    const household = await buildClientUser(f.firm, f.client);
    for (const user of [f.owner, f.coordinator, f.technician, household]) {
      expect((await (await as(user)).get(`/api/operator/tenants/${f.firm.id}/invoices`)).status).toBe(403);
    }
  });
});
