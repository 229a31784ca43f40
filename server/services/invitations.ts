import { Op } from 'sequelize';
import { LIMITS } from '@domain/limits';
import type { Role } from '@domain/roles';
import { abilityFor } from '@domain/abilities';
import type { AcceptInvitationInput } from '@domain/schemas/auth';
import { abilityUserOf } from '../auth/ability-user';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import { requireTenantId, requireTransaction, scoped, type Ctx } from '../context';
import type { AppDeps } from '../deps';
import { portalPath } from '@domain/short-name';
import { assertMailAllowed } from '../emails/mail-limits';
import type { MailMessage } from '../emails/mailer';
import { firmBrandOf } from '../emails/firm-brand';
import { invitationEmail, portalInvitationEmail } from '../emails/templates';
import { errors } from '../errors';
import { Invitation } from '../models/Invitation';
import { Tenant } from '../models/Tenant';
import { User } from '../models/User';
import { recordAudit } from './audit-recorder';
import { assertWithinPlan } from './plan-limits';

const DAY_MS = 24 * 60 * 60 * 1000;

type MailDeps = Pick<AppDeps, 'outbox' | 'appUrl' | 'files'>;

/** Queues the invitation e-mail in the caller's transaction; each fresh link is its own message. */
async function queueInvitationMail(invitation: Invitation, token: string, tokenHash: string, ctx: Ctx, deps: MailDeps): Promise<void> {
  const tenant = ctx.tenant;
  const queue = (message: MailMessage) =>
    deps.outbox.enqueue(requireTransaction(ctx), {
      key: `invitation:${invitation.id}:${tokenHash.slice(0, 24)}`,
      purpose: 'invitation',
      tenantId: invitation.tenantId,
      actorId: ctx.user?.id ?? null,
      message,
    });
  if (invitation.role === 'client' && tenant) {
    // A homeowner's invitation opens the firm's own portal, in the firm's colours, with its logo.
    await queue(
      portalInvitationEmail({
        to: invitation.email,
        firm: await firmBrandOf(tenant, deps.files),
        link: `${deps.appUrl}${portalPath(tenant.shortName)}/invitations/${token}`,
        expiresAt: invitation.expiresAt,
      }),
    );
    return;
  }
  await queue(
    invitationEmail({
      to: invitation.email,
      firmName: tenant?.name ?? 'Your alarm firm',
      inviterName: ctx.user?.name ?? 'Someone',
      role: invitation.role,
      link: `${deps.appUrl}/invitations/${token}`,
      expiresAt: invitation.expiresAt,
    }),
  );
}

/**
 * Invites a person to the acting user's firm and replaces any pending invitation to the
 * same address. An address that already has a sign-in at this firm is refused (that is the
 * firm's own data). An address with a sign-in elsewhere is invited exactly like a new one,
 * so the inviter learns nothing about other firms; the invitee is told at the link that the
 * address cannot join (one person, one sign-in across the service).
 */
export async function inviteToFirm(
  ctx: Ctx,
  input: { email: string; role: Role; clientId?: string | null },
  deps: MailDeps & { now: Date },
): Promise<Invitation> {
  const member = await User.findOne({ where: scoped(ctx, { email: input.email }), transaction: ctx.transaction });
  if (member) throw alreadyAtFirm(member);
  await assertMailAllowed(ctx.transaction, { purpose: 'invitation', tenantId: requireTenantId(ctx), actorId: ctx.user?.id ?? null, recipients: [input.email] });
  // A staff invitation holds a seat from the moment it is sent (one replacing a pending one to the same address does not add one).
  if (input.role !== 'client') {
    const replacing = await Invitation.count({
      where: scoped(ctx, { email: input.email, role: { [Op.ne]: 'client' }, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: deps.now } }),
      transaction: ctx.transaction,
    });
    if (replacing === 0) await assertWithinPlan(ctx, 'seat', deps.now);
  }
  const { token, tokenHash } = newToken();
  await Invitation.update(
    { revokedAt: deps.now },
    { where: scoped(ctx, { email: input.email, acceptedAt: null, revokedAt: null }), transaction: ctx.transaction },
  );
  const invitation = await Invitation.create(
    {
      tenantId: scoped(ctx).tenantId,
      email: input.email,
      role: input.role,
      tokenHash,
      invitedById: ctx.user?.id ?? null,
      clientId: input.role === 'client' ? (input.clientId ?? null) : null,
      expiresAt: new Date(deps.now.getTime() + LIMITS.invitationDays * DAY_MS),
      sentAt: deps.now,
    },
    { transaction: ctx.transaction },
  );
  await recordAudit(ctx, { action: 'invitation.sent', subjectType: 'Invitation', subjectId: invitation.id, details: { email: input.email, role: input.role } });
  await queueInvitationMail(invitation, token, tokenHash, ctx, deps);
  return invitation;
}

/** Sends a pending invitation again with a fresh link and a fresh expiry; the old link stops working. */
export async function resendInvitation(ctx: Ctx, invitation: Invitation, deps: MailDeps & { now: Date }): Promise<Invitation> {
  if (invitation.acceptedAt) throw errors.conflict('This invitation was already accepted.');
  await assertMailAllowed(ctx.transaction, { purpose: 'invitation', tenantId: invitation.tenantId, actorId: ctx.user?.id ?? null, recipients: [invitation.email] });
  // A withdrawn or expired staff invitation holds no seat; sending it again takes one.
  const heldSeat = !invitation.revokedAt && invitation.expiresAt.getTime() > deps.now.getTime();
  if (invitation.role !== 'client' && !heldSeat) await assertWithinPlan(ctx, 'seat', deps.now);
  const { token, tokenHash } = newToken();
  await invitation.update(
    { tokenHash, revokedAt: null, sentAt: deps.now, expiresAt: new Date(deps.now.getTime() + LIMITS.invitationDays * DAY_MS) },
    { transaction: ctx.transaction },
  );
  await recordAudit(ctx, { action: 'invitation.resent', subjectType: 'Invitation', subjectId: invitation.id, details: { email: invitation.email } });
  await queueInvitationMail(invitation, token, tokenHash, ctx, deps);
  return invitation;
}

export async function revokeInvitation(ctx: Ctx, invitation: Invitation, now: Date): Promise<void> {
  if (invitation.acceptedAt) throw errors.conflict('This invitation was already accepted; deactivate the person instead.');
  await invitation.update({ revokedAt: now }, { transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'invitation.revoked', subjectType: 'Invitation', subjectId: invitation.id, details: { email: invitation.email } });
}

/** The inviter's answer for an address already signed in at their own firm. */
function alreadyAtFirm(member: User) {
  const client = member.role === 'client';
  return errors.emailTaken(
    'email',
    client
      ? `${member.email} already has a sign-in to your client portal. Invite another address, or find them on the client's page.`
      : `${member.email} is already on your staff. Invite another address, or change their role on the staff page.`,
    client ? 'This address already has a portal sign-in at your firm.' : 'This address is already on your staff.',
  );
}

/** The invitee's answer when their address already has a sign-in (at another firm, or since invited here). */
export function addressHasSignIn(email: string, firmName: string) {
  return errors.emailTaken(
    null,
    `${email} already has a Mullion sign-in, and one address is one sign-in, so ${firmName} cannot add it as well. Sign in with it as usual, or ask ${firmName} to invite another of your addresses.`,
  );
}

const UNUSABLE = 'This invitation link is no longer valid. Ask the firm to send a new one.';

/** Finds a usable invitation by its token (deliberately cross-firm: the token is the key). */
export async function findUsableInvitation(token: string, now: Date): Promise<{ invitation: Invitation; tenant: Tenant }> {
  const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(token) }, crossTenant: true });
  if (!invitation || invitation.invitationState(now) !== 'pending') throw notUsable();
  const tenant = await Tenant.findOne({ where: { id: invitation.tenantId } });
  if (!tenant) throw notUsable();
  if (tenant.state === 'suspended') throw errors.firmSuspended();
  return { invitation, tenant };
}

function notUsable() {
  const e = errors.notFound('invitation');
  e.message = UNUSABLE;
  return e;
}

/** Creates the invitee's sign-in with the invited role; the invitation is used up. */
export async function acceptInvitation(
  token: string,
  input: AcceptInvitationInput,
  deps: Pick<AppDeps, 'sequelize'> & { now: Date; ip?: string },
): Promise<User> {
  const { invitation, tenant } = await findUsableInvitation(token, deps.now);
  const passwordHash = await hashPassword(input.password);
  return deps.sequelize.transaction(async (transaction) => {
    // Claim the invitation first, so two accepts of the same link cannot both succeed.
    const [claimed] = await Invitation.update(
      { acceptedAt: deps.now },
      { where: { id: invitation.id, tenantId: invitation.tenantId, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: deps.now } }, transaction },
    );
    if (claimed !== 1) throw notUsable();
    const taken = await User.count({ where: { email: invitation.email }, crossTenant: true, transaction });
    if (taken > 0) throw addressHasSignIn(invitation.email, tenant.name);
    if (invitation.role === 'client' && !invitation.clientId) throw notUsable();
    const user = await User.create(
      {
        tenantId: tenant.id,
        email: invitation.email,
        name: input.name,
        role: invitation.role,
        passwordHash,
        clientId: invitation.role === 'client' ? invitation.clientId : null,
      },
      { transaction },
    );
    await invitation.update({ acceptedUserId: user.id }, { transaction });
    user.tenant = tenant;
    const ctx: Ctx = {
      user,
      tenant,
      tenantId: tenant.id,
      ability: abilityFor(abilityUserOf(user)),
      transaction,
      ip: deps.ip,
    };
    await recordAudit(ctx, { action: 'invitation.accepted', subjectType: 'User', subjectId: user.id, details: { email: user.email, role: user.role } });
    return user;
  });
}
