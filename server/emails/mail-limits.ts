/**
 * Limits on everything that sends e-mail: per acting user (counted from the audit trail:
 * the actions that cause mail) and per recipient (counted from the outbox: the mail that
 * address got). Every count names the firm, so one firm's traffic never uses up another's
 * allowance. Over a limit → 429 `rate_limited`, before anything is saved.
 *
 * The windows and numbers are common practice for transactional mail (a handful of repeats
 * of one message an hour, a working day's worth of actions per user), not from a published
 * source.
 */
import { Op, type Transaction } from 'sequelize';
import { errors } from '../errors';
import { AuditEvent } from '../models/AuditEvent';
import { OutboxMessage } from '../models/OutboxMessage';
import type { MailPurpose } from './outbox';

const HOUR_MS = 60 * 60 * 1000;

interface Allowance {
  limit: number;
  windowMs: number;
}

interface PurposeLimits {
  /** audit actions by the acting user that count towards their allowance */
  actions: string[];
  perUser: Allowance;
  perRecipient: Allowance;
  /** how the refusal reads, e.g. "invitations" */
  what: string;
}

/** Sign-up e-mails are bounded by the sign-up request limits (middlewares/rate-limit.ts), not here: no firm or user exists yet to count against. */
export const MAIL_LIMITS: Record<Exclude<MailPurpose, 'password_reset' | 'sign_up'>, PurposeLimits> = {
  invitation: {
    actions: ['invitation.sent', 'invitation.resent'],
    perUser: { limit: 50, windowMs: HOUR_MS },
    perRecipient: { limit: 3, windowMs: HOUR_MS },
    what: 'invitations',
  },
  service_request: {
    actions: ['job.requested_by_client'],
    perUser: { limit: 5, windowMs: HOUR_MS },
    perRecipient: { limit: 60, windowMs: HOUR_MS },
    what: 'service requests',
  },
  contacts_changed: {
    actions: ['contacts.replaced'],
    perUser: { limit: 10, windowMs: HOUR_MS },
    perRecipient: { limit: 60, windowMs: HOUR_MS },
    what: 'changes to the emergency contacts',
  },
  job_completed: {
    actions: ['job.completed'],
    perUser: { limit: 60, windowMs: HOUR_MS },
    perRecipient: { limit: 10, windowMs: HOUR_MS },
    what: 'completion reports',
  },
};

/** A password reset never answers differently (no account enumeration): over this, no mail is made. */
export const PASSWORD_RESET_MAILS_PER_ADDRESS: Allowance = { limit: 3, windowMs: HOUR_MS };

function perHour(a: Allowance): string {
  return a.windowMs === HOUR_MS ? `${a.limit} an hour` : `${a.limit} every ${Math.round(a.windowMs / 60_000)} minutes`;
}

/**
 * Refuses (429) when the acting user or any recipient has had its allowance for this
 * purpose in this firm. Call before the change that causes the mail, in its transaction.
 */
export async function assertMailAllowed(
  transaction: Transaction | undefined,
  input: { purpose: keyof typeof MAIL_LIMITS; tenantId: string; actorId: string | null; recipients: string[] },
): Promise<void> {
  const limits = MAIL_LIMITS[input.purpose];
  const at = Date.now();
  if (input.actorId) {
    const done = await AuditEvent.count({
      where: {
        tenantId: input.tenantId,
        actorId: input.actorId,
        action: { [Op.in]: limits.actions },
        createdAt: { [Op.gt]: new Date(at - limits.perUser.windowMs) },
      },
      transaction: transaction ?? null,
    });
    if (done >= limits.perUser.limit) {
      throw errors.rateLimited(`Too many ${limits.what} from you: at most ${perHour(limits.perUser)}. Wait a while and try again.`);
    }
  }
  for (const to of new Set(input.recipients)) {
    if ((await recentMailTo(transaction, { tenantId: input.tenantId, purpose: input.purpose, to, windowMs: limits.perRecipient.windowMs })) >= limits.perRecipient.limit) {
      throw errors.rateLimited(`Too many ${limits.what} to ${to}: at most ${perHour(limits.perRecipient)}. Wait a while and try again.`);
    }
  }
}

/** Mail of one purpose to one address in one firm within the window. */
export function recentMailTo(
  transaction: Transaction | undefined,
  input: { tenantId: string; purpose: MailPurpose; to: string; windowMs: number },
): Promise<number> {
  return OutboxMessage.count({
    where: { tenantId: input.tenantId, purpose: input.purpose, to: input.to, createdAt: { [Op.gt]: new Date(Date.now() - input.windowMs) } },
    transaction: transaction ?? null,
  });
}

/**
 * Password-reset mail to one address in the window. Across firms on purpose: an address
 * has one sign-in in the whole service (operators have no firm), so this counts one person.
 */
export function recentPasswordResetMailTo(to: string): Promise<number> {
  return OutboxMessage.count({
    where: { purpose: 'password_reset', to, createdAt: { [Op.gt]: new Date(Date.now() - PASSWORD_RESET_MAILS_PER_ADDRESS.windowMs) } },
    crossTenant: true,
  });
}
