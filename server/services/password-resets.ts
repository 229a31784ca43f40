import { Op } from 'sequelize';
import { portalPath } from '@domain/short-name';
import { Tenant } from '../models/Tenant';
import { LIMITS } from '@domain/limits';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import type { AppDeps } from '../deps';
import { firmBrandOf } from '../emails/firm-brand';
import { passwordResetEmail } from '../emails/templates';
import { errors } from '../errors';
import { PasswordReset } from '../models/PasswordReset';
import { User } from '../models/User';
import { AuditEvent } from '../models/AuditEvent';
import { endSessionsOf } from './sessions';
import { PASSWORD_RESET_MAILS_PER_ADDRESS, recentPasswordResetMailTo } from '../emails/mail-limits';

const MINUTE_MS = 60 * 1000;

/**
 * Makes a reset token and queues the link when the address has an active sign-in; does
 * nothing otherwise. The route runs this in the background and answers at once, so neither
 * the answer nor its timing says whether the address has an account.
 */
export async function requestPasswordReset(
  email: string,
  deps: Pick<AppDeps, 'sequelize' | 'outbox' | 'appUrl' | 'logger' | 'files'> & { now: Date },
): Promise<void> {
  const user = await User.findOne({ where: { email }, crossTenant: true });
  if (!user || user.deactivatedAt) return;
  if ((await recentPasswordResetMailTo(user.email)) >= PASSWORD_RESET_MAILS_PER_ADDRESS.limit) {
    deps.logger.warn('Password-reset e-mail not made: the address had its allowance', { userId: user.id });
    return;
  }
  // A homeowner resets from (and returns to) their firm's portal.
  const firm = user.role === 'client' && user.tenantId ? await Tenant.findByPk(user.tenantId) : null;
  const base = firm ? `${deps.appUrl}${portalPath(firm.shortName)}` : deps.appUrl;
  const brand = firm ? await firmBrandOf(firm, deps.files) : null;
  await deps.sequelize.transaction(async (transaction) => {
    const { token, tokenHash } = newToken();
    const reset = await PasswordReset.create(
      { tenantId: user.tenantId, userId: user.id, tokenHash, expiresAt: new Date(deps.now.getTime() + LIMITS.passwordResetMinutes * MINUTE_MS) },
      { transaction },
    );
    await deps.outbox.enqueue(transaction, {
      key: `password-reset:${reset.id}`,
      purpose: 'password_reset',
      tenantId: user.tenantId,
      message: passwordResetEmail({
        to: user.email,
        name: user.name,
        link: `${base}/reset-password/${token}`,
        minutes: LIMITS.passwordResetMinutes,
        ...(brand ? { firm: brand } : {}),
      }),
    });
  });
}

/**
 * Sets a new password with a single-use, unexpired token and ends the user's other
 * sessions. Answers the user's e-mail address.
 */
export async function completePasswordReset(
  token: string,
  password: string,
  deps: Pick<AppDeps, 'sequelize'> & { now: Date; ip?: string },
): Promise<string> {
  const passwordHash = await hashPassword(password);
  return deps.sequelize.transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) }, transaction });
    const [claimed] = reset
      ? await PasswordReset.update(
          { usedAt: deps.now },
          { where: { id: reset.id, usedAt: null, expiresAt: { [Op.gt]: deps.now } }, transaction },
        )
      : [0];
    if (!reset || claimed !== 1) {
      const e = errors.notFound('reset link');
      e.message = 'This reset link is no longer valid. Ask for a new one.';
      throw e;
    }
    const user = await User.findOne({ where: { id: reset.userId }, crossTenant: true, transaction });
    if (!user || user.deactivatedAt) throw errors.userDeactivated();
    await user.update({ passwordHash }, { transaction });
    await endSessionsOf([user.id], { transaction });
    await AuditEvent.create(
      { tenantId: user.tenantId, actorId: user.id, actorRole: user.role, action: 'password.reset', subjectType: 'User', subjectId: user.id, details: null, ip: deps.ip ?? null },
      { transaction },
    );
    return user.email;
  });
}
