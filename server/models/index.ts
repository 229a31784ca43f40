import type { Sequelize } from 'sequelize';
import { AuditEvent } from './AuditEvent';
import { Client } from './Client';
import { Document } from './Document';
import { EmergencyContact } from './EmergencyContact';
import { Floor } from './Floor';
import { Invitation } from './Invitation';
import { Job } from './Job';
import { Opening } from './Opening';
import { OutboxMessage } from './OutboxMessage';
import { Panel } from './Panel';
import { PasswordReset } from './PasswordReset';
import { Room } from './Room';
import { Session } from './Session';
import { SignupRequest } from './SignupRequest';
import { Site } from './Site';
import { Tenant } from './Tenant';
import { StripeEvent } from './StripeEvent';
import { SubscriptionChange } from './SubscriptionChange';
import { User } from './User';
import { WalkTest } from './WalkTest';
import { Zone } from './Zone';
import { ZoneChange } from './ZoneChange';
import { guardIncludes } from './base/tenant-guard';

export { AuditEvent, Client, Document, EmergencyContact, Floor, Invitation, Job, Opening, Panel, PasswordReset, Room, Session, SignupRequest, Site, Tenant, User, WalkTest, Zone, ZoneChange, StripeEvent, SubscriptionChange, OutboxMessage };

/** Binds every model to this database and wires the associations. */
export function initModels(sequelize: Sequelize): void {
  const models = [Tenant, User, Invitation, PasswordReset, SignupRequest, AuditEvent, Session, Client, Site, EmergencyContact, Document, Panel, Zone, ZoneChange, Floor, Room, Opening, Job, WalkTest, StripeEvent, SubscriptionChange, OutboxMessage];
  for (const model of models) model.initModel(sequelize);

  Tenant.hasMany(User, { foreignKey: 'tenantId', as: 'users' });
  User.belongsTo(Tenant, { foreignKey: 'tenantId', as: 'tenant' });
  Tenant.hasMany(Invitation, { foreignKey: 'tenantId', as: 'invitations' });
  Client.hasMany(Site, { foreignKey: 'clientId', as: 'sites' });
  Site.belongsTo(Client, { foreignKey: 'clientId', as: 'client' });
  Site.hasMany(Panel, { foreignKey: 'siteId', as: 'panels' });
  Panel.hasMany(Zone, { foreignKey: 'panelId', as: 'zones' });
  Site.hasMany(Floor, { foreignKey: 'siteId', as: 'floors' });
  Floor.hasMany(Room, { foreignKey: 'floorId', as: 'rooms' });
  Room.hasMany(Opening, { foreignKey: 'roomId', as: 'openings' });

  for (const model of models) guardIncludes(model);
}
