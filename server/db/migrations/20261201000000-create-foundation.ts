import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};

export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('tenants', {
    id: { type: DataTypes.UUID, primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    shortName: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    state: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'trialing' },
    planKey: { type: DataTypes.STRING(20), allowNull: true },
    trialEndsAt: { type: DataTypes.DATE, allowNull: true },
    suspendedAt: { type: DataTypes.DATE, allowNull: true },
    suspendedReason: { type: DataTypes.STRING(500), allowNull: true },
    stateBeforeSuspension: { type: DataTypes.STRING(20), allowNull: true },
    timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'America/Chicago' },
    licenceNumber: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    monitoringCenterName: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    monitoringCenterPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    accentColor: { type: DataTypes.STRING(7), allowNull: false, defaultValue: '#8f5c17' },
    logoFileId: { type: DataTypes.STRING(80), allowNull: true },
    logoContentType: { type: DataTypes.STRING(40), allowNull: true },
    ...timestamps,
  });

  await qi.createTable('users', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'tenants', key: 'id' },
      onDelete: 'CASCADE',
    },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    passwordHash: { type: DataTypes.STRING(255), allowNull: false },
    deactivatedAt: { type: DataTypes.DATE, allowNull: true },
    lastSignInAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('users', ['tenantId', 'role'], { name: 'users_tenant_role' });

  await qi.createTable('invitations', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'tenants', key: 'id' },
      onDelete: 'CASCADE',
    },
    email: { type: DataTypes.STRING(254), allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    invitedById: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    acceptedAt: { type: DataTypes.DATE, allowNull: true },
    acceptedUserId: { type: DataTypes.UUID, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('invitations', ['tenantId', 'email'], { name: 'invitations_tenant_email' });

  await qi.createTable('password_resets', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: { type: DataTypes.UUID, allowNull: true, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' },
    userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('password_resets', ['userId'], { name: 'password_resets_user' });

  await qi.createTable('audit_events', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: { type: DataTypes.UUID, allowNull: true, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' },
    actorId: { type: DataTypes.UUID, allowNull: true },
    actorRole: { type: DataTypes.STRING(20), allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    subjectType: { type: DataTypes.STRING(40), allowNull: false },
    subjectId: { type: DataTypes.UUID, allowNull: true },
    details: { type: DataTypes.JSON, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('audit_events', ['tenantId', 'createdAt'], { name: 'audit_events_tenant_created' });

  await qi.createTable('sessions', {
    sid: { type: DataTypes.STRING(36), primaryKey: true },
    userId: { type: DataTypes.UUID, allowNull: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('sessions', ['userId'], { name: 'sessions_user' });
  await qi.addIndex('sessions', ['expires'], { name: 'sessions_expires' });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('sessions');
  await qi.dropTable('audit_events');
  await qi.dropTable('password_resets');
  await qi.dropTable('invitations');
  await qi.dropTable('users');
  await qi.dropTable('tenants');
}
