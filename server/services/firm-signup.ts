import { Op, type Sequelize } from 'sequelize';
import { shortNameFrom, uniqueShortName, portalPath } from '@domain/short-name';
import { TRIAL_DAYS, trialEndsAt } from '@domain/tenant-states';
import type { SignUpInput } from '@domain/schemas/auth';
import { abilityFor } from '@domain/abilities';
import { LIMITS } from '@domain/limits';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import type { AppDeps } from '../deps';
import { signUpAccountExistsEmail, signUpConfirmationEmail } from '../emails/templates';
import { errors } from '../errors';
import { SignupRequest } from '../models/SignupRequest';
import { Tenant } from '../models/Tenant';
import { User } from '../models/User';
import { recordAudit } from './audit-recorder';

const HOUR_MS = 60 * 60 * 1000;

/** Picks a free short name for a firm's portal address. */
export async function freeShortName(firmName: string): Promise<string> {
  const base = shortNameFrom(firmName);
  const rows = await Tenant.findAll({ attributes: ['shortName'], where: { shortName: { [Op.like]: `${base}%` } } });
  const taken = new Set(rows.map((r) => r.shortName));
  return uniqueShortName(base, (c) => taken.has(c));
}

/**
 * A sign-up request. Whatever the address, the caller learns nothing: a new address gets a
 * link that confirms it and creates the firm; an address that already has a sign-in gets an
 * e-mail saying so, with sign-in and reset links. Both paths hash the password and send one
 * e-mail, so they take about as long.
 */
export async function requestFirmSignup(input: SignUpInput, deps: Pick<AppDeps, 'sequelize' | 'outbox' | 'appUrl'> & { now: Date }): Promise<void> {
  const passwordHash = await hashPassword(input.password);
  const existing = await User.findOne({ where: { email: input.email }, crossTenant: true });
  const { token, tokenHash } = newToken();
  if (existing) {
    // A household signs in (and resets) at its firm's portal; staff and operators at Mullion's own pages.
    const firm = existing.role === 'client' && existing.tenantId ? await Tenant.findByPk(existing.tenantId) : null;
    const base = firm ? `${deps.appUrl}${portalPath(firm.shortName)}` : deps.appUrl;
    await deps.sequelize.transaction((transaction) =>
      deps.outbox.enqueue(transaction, {
        // each request is its own message (the sign-up limits bound how many)
        key: `sign-up-account-exists:${existing.id}:${tokenHash.slice(0, 24)}`,
        purpose: 'sign_up',
        tenantId: existing.tenantId,
        message: signUpAccountExistsEmail({
          to: existing.email,
          name: existing.name,
          signInLink: firm ? base : `${base}/sign-in`,
          resetLink: `${base}/forgot-password`,
        }),
      }),
    );
    return;
  }
  await deps.sequelize.transaction(async (transaction) => {
    await SignupRequest.create(
      {
        email: input.email,
        firmName: input.firmName,
        name: input.name,
        passwordHash,
        tokenHash,
        expiresAt: new Date(deps.now.getTime() + LIMITS.signUpConfirmationHours * HOUR_MS),
      },
      { transaction },
    );
    await deps.outbox.enqueue(transaction, {
      key: `sign-up-confirmation:${tokenHash.slice(0, 24)}`,
      purpose: 'sign_up',
      // no firm exists until the link is confirmed
      tenantId: null,
      message: signUpConfirmationEmail({
        to: input.email,
        name: input.name,
        firmName: input.firmName,
        link: `${deps.appUrl}/sign-up/confirm/${token}`,
        hours: LIMITS.signUpConfirmationHours,
        trialDays: TRIAL_DAYS,
      }),
    });
  });
}

function notUsable() {
  const e = errors.notFound('sign-up link');
  e.message = 'This link is no longer valid: it was already used or has expired. Sign in if you finished setting up your firm, or sign up again.';
  return e;
}

/** A sign-up waiting for confirmation, by the token from the e-mail (the token is the key). */
export async function findUsableSignup(token: string, now: Date): Promise<SignupRequest> {
  const request = await SignupRequest.findOne({ where: { tokenHash: hashToken(token) } });
  if (!request || request.usedAt || request.expiresAt.getTime() <= now.getTime()) throw notUsable();
  return request;
}

/** Creates the firm on its trial and its owner from a confirmed sign-up, in one transaction; the link is used up. */
export async function confirmFirmSignup(token: string, deps: { sequelize: Sequelize; now: Date; ip?: string }): Promise<User> {
  const request = await findUsableSignup(token, deps.now);
  const shortName = await freeShortName(request.firmName);
  return deps.sequelize.transaction(async (transaction) => {
    // Claim the link first, so two confirmations of the same link cannot both create a firm.
    const [claimed] = await SignupRequest.update(
      { usedAt: deps.now },
      { where: { id: request.id, usedAt: null, expiresAt: { [Op.gt]: deps.now } }, transaction },
    );
    if (claimed !== 1) throw notUsable();
    // The address may have gained a sign-in since (an earlier link, an invitation): only its owner holds this link.
    const taken = await User.count({ where: { email: request.email }, crossTenant: true, transaction });
    if (taken > 0) {
      throw errors.conflict(
        `${request.email} already has a Mullion sign-in, so no new firm was set up. Sign in, or reset your password if you have forgotten it.`,
      );
    }
    const tenant = await Tenant.create(
      { name: request.firmName, shortName, state: 'trialing', trialEndsAt: trialEndsAt(deps.now) },
      { transaction },
    );
    const owner = await User.create(
      { tenantId: tenant.id, email: request.email, name: request.name, role: 'owner', passwordHash: request.passwordHash },
      { transaction },
    );
    await request.update({ tenantId: tenant.id }, { transaction });
    owner.tenant = tenant;
    const ctx = {
      user: owner,
      tenant,
      tenantId: tenant.id,
      ability: abilityFor({ id: owner.id, role: 'owner', tenantId: tenant.id }),
      transaction,
      ip: deps.ip,
    };
    await recordAudit(ctx, { action: 'firm.created', subjectType: 'Tenant', subjectId: tenant.id, details: { name: tenant.name, shortName } });
    return owner;
  });
}
