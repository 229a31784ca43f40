import type { Sequelize } from 'sequelize';
import { AuditEvent } from './AuditEvent';
import { Invitation } from './Invitation';
import { PasswordReset } from './PasswordReset';
import { Session } from './Session';
import { Tenant } from './Tenant';
import { User } from './User';
import { guardIncludes } from './base/tenant-guard';

export { AuditEvent, Invitation, PasswordReset, Session, Tenant, User };

/** Binds every model to this database and wires the associations. */
export function initModels(sequelize: Sequelize): void {
  Tenant.initModel(sequelize);
  User.initModel(sequelize);
  Invitation.initModel(sequelize);
  PasswordReset.initModel(sequelize);
  AuditEvent.initModel(sequelize);
  Session.initModel(sequelize);

  Tenant.hasMany(User, { foreignKey: 'tenantId', as: 'users' });
  User.belongsTo(Tenant, { foreignKey: 'tenantId', as: 'tenant' });
  Tenant.hasMany(Invitation, { foreignKey: 'tenantId', as: 'invitations' });

  for (const model of [Tenant, User, Invitation, PasswordReset, AuditEvent]) guardIncludes(model);
}
