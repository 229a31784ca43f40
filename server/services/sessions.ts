import { Op } from 'sequelize';
import type { Ctx } from '../context';
import { Session } from '../models/Session';

/**
 * Ends every stored session of these users (after a password reset). A deactivated user's
 * or suspended firm's sessions are not ended here: the session guard refuses them on their
 * next request with the reason.
 */
export async function endSessionsOf(userIds: string[], ctx: Pick<Ctx, 'transaction'>): Promise<void> {
  if (userIds.length === 0) return;
  await Session.destroy({ where: { userId: { [Op.in]: userIds } }, transaction: ctx.transaction });
}
