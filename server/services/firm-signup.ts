import { Op, type Sequelize } from 'sequelize';
import { shortNameFrom, uniqueShortName } from '@domain/short-name';
import { trialEndsAt } from '@domain/tenant-states';
import type { SignUpInput } from '@domain/schemas/auth';
import { abilityFor } from '@domain/abilities';
import { hashPassword } from '../auth/passwords';
import { errors } from '../errors';
import { Tenant } from '../models/Tenant';
import { User } from '../models/User';
import { recordAudit } from './audit-recorder';

/** Picks a free short name for a firm's portal address. */
export async function freeShortName(firmName: string): Promise<string> {
  const base = shortNameFrom(firmName);
  const rows = await Tenant.findAll({ attributes: ['shortName'], where: { shortName: { [Op.like]: `${base}%` } } });
  const taken = new Set(rows.map((r) => r.shortName));
  return uniqueShortName(base, (c) => taken.has(c));
}

/** Creates a firm on its trial and its owner, in one transaction. */
export async function firmSignup(input: SignUpInput, deps: { sequelize: Sequelize; now: Date; ip?: string }): Promise<User> {
  const existing = await User.count({ where: { email: input.email }, crossTenant: true });
  if (existing > 0) throw errors.emailTaken();
  const shortName = await freeShortName(input.firmName);
  const passwordHash = await hashPassword(input.password);
  return deps.sequelize.transaction(async (transaction) => {
    const tenant = await Tenant.create(
      { name: input.firmName, shortName, state: 'trialing', trialEndsAt: trialEndsAt(deps.now) },
      { transaction },
    );
    const owner = await User.create(
      { tenantId: tenant.id, email: input.email, name: input.name, role: 'owner', passwordHash },
      { transaction },
    );
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
