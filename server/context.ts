import type { Transaction } from 'sequelize';
import type { AppAbility } from '@domain/abilities';
import type { Tenant } from './models/Tenant';
import type { User } from './models/User';
import { errors } from './errors';

/** What every service receives: who is acting, for which firm, with which rights. */
export interface Ctx {
  user: User | null;
  tenant: Tenant | null;
  tenantId: string | null;
  ability: AppAbility;
  transaction?: Transaction;
  ip?: string | undefined;
}

/** The acting user's firm id, or 403 for a caller without a firm (an operator on a firm route). */
export function requireTenantId(ctx: Ctx): string {
  if (!ctx.tenantId) throw errors.forbidden('This page belongs to a firm’s workspace; the operator has no firm.');
  return ctx.tenantId;
}

/** A `where` that names the acting user's firm: use it for every firm-owned query. */
export function scoped<W extends object>(ctx: Ctx, where?: W): W & { tenantId: string } {
  return { ...(where ?? ({} as W)), tenantId: requireTenantId(ctx) };
}

/** The transaction a service must run in (mail is queued in it); a missing one is a programming error. */
export function requireTransaction(ctx: Ctx): Transaction {
  if (!ctx.transaction) throw new Error('This operation must run in a transaction (inTransaction).');
  return ctx.transaction;
}

export function withTransaction(ctx: Ctx, transaction: Transaction): Ctx {
  return { ...ctx, transaction };
}
