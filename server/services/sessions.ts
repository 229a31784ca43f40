import { Op, QueryTypes } from 'sequelize';
import type { Ctx } from '../context';
import { User } from '../models/User';

/**
 * Ends every stored session of these users. (Each request also re-checks the user and firm,
 * so this is belt and braces: it frees the rows at once.)
 */
export async function endSessionsOf(userIds: string[], ctx: Pick<Ctx, 'transaction'>): Promise<void> {
  if (userIds.length === 0) return;
  const sequelize = User.sequelize;
  if (!sequelize) return;
  await sequelize.query(`DELETE FROM sessions WHERE userId IN (:ids)`, {
    replacements: { ids: userIds },
    type: QueryTypes.DELETE,
    transaction: ctx.transaction,
  });
}

/** The ids of a firm's people, for ending their sessions when the firm is suspended. */
export async function userIdsOfTenant(tenantId: string, ctx: Pick<Ctx, 'transaction'>): Promise<string[]> {
  const users = await User.findAll({ attributes: ['id'], where: { tenantId: { [Op.eq]: tenantId } }, transaction: ctx.transaction });
  return users.map((u) => u.id);
}
