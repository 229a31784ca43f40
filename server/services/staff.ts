import type { StaffUpdateInput } from '@domain/schemas/staff';
import type { Ctx } from '../context';
import { errors } from '../errors';
import type { User } from '../models/User';
import { recordAudit } from './audit-recorder';
import { assertWithinPlan } from './plan-limits';

/**
 * Changes a colleague's role or active state. The owner cannot change their own role or
 * deactivate themselves (a firm always keeps its owner). Effects apply on the person's
 * next request: roles are read from the database each time; a deactivated person's open
 * session is refused with 403 user_deactivated and signed out (session guard). The
 * session is not deleted here, or that request could not say why.
 */
export async function updateStaffMember(ctx: Ctx, member: User, input: StaffUpdateInput, now: Date): Promise<User> {
  if (member.role === 'owner' || member.role === 'client') {
    throw errors.validation(
      member.role === 'owner' ? 'The firm owner’s role and sign-in cannot be changed here.' : 'Clients are managed from their client record.',
      { role: 'Not changeable for this person.' },
    );
  }
  const before = { role: member.role, active: !member.deactivatedAt };
  if (input.active === true && !before.active) await assertWithinPlan(ctx, 'seat', now);
  if (input.role !== undefined) member.role = input.role;
  if (input.active !== undefined) member.deactivatedAt = input.active ? null : (member.deactivatedAt ?? now);
  await member.save({ transaction: ctx.transaction });
  const after = { role: member.role, active: !member.deactivatedAt };
  await recordAudit(ctx, {
    action: before.role !== after.role && before.active !== after.active ? 'staff.changed' : before.role !== after.role ? 'staff.role_changed' : after.active ? 'staff.reactivated' : 'staff.deactivated',
    subjectType: 'User',
    subjectId: member.id,
    details: { before, after },
  });
  return member;
}
