import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const tenantRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' };

export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('tenants', 'upkeepSettings', { type: DataTypes.JSON, allowNull: true });

  await qi.createTable('clients', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    name: { type: DataTypes.STRING(120), allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
    phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    altPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'active' },
    ...timestamps,
  });
  await qi.addIndex('clients', ['tenantId', 'name'], { name: 'clients_tenant_name' });

  // A client (homeowner) sign-in is linked to one client record.
  await qi.addColumn('users', 'clientId', { type: DataTypes.UUID, allowNull: true, references: { model: 'clients', key: 'id' }, onDelete: 'SET NULL' });

  await qi.createTable('sites', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    clientId: { type: DataTypes.UUID, allowNull: false, references: { model: 'clients', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    addressLine1: { type: DataTypes.STRING(200), allowNull: false },
    addressLine2: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
    city: { type: DataTypes.STRING(100), allowNull: false },
    region: { type: DataTypes.STRING(100), allowNull: false, defaultValue: '' },
    postalCode: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
    country: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'US' },
    timeZone: { type: DataTypes.STRING(64), allowNull: false },
    latitude: { type: DataTypes.DOUBLE, allowNull: true },
    longitude: { type: DataTypes.DOUBLE, allowNull: true },
    monitoringAccount: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
    passcodeCipher: { type: DataTypes.TEXT, allowNull: true },
    accessNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    permitNumber: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    permitAuthority: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    permitExpiresOn: { type: DataTypes.DATEONLY, allowNull: true },
    contractStartsOn: { type: DataTypes.DATEONLY, allowNull: true },
    contractTermMonths: { type: DataTypes.INTEGER, allowNull: true },
    contractMonthlyFeeCents: { type: DataTypes.INTEGER, allowNull: true },
    contractCancelledOn: { type: DataTypes.DATEONLY, allowNull: true },
    contractCancelReason: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    ...timestamps,
  });
  await qi.addIndex('sites', ['tenantId', 'clientId'], { name: 'sites_tenant_client' });
  await qi.addIndex('sites', ['tenantId', 'name'], { name: 'sites_tenant_name' });

  await qi.createTable('emergency_contacts', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    position: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    relation: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    phone: { type: DataTypes.STRING(40), allowNull: false },
    altPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    ...timestamps,
  });
  await qi.addIndex('emergency_contacts', ['tenantId', 'siteId', 'position'], { name: 'contacts_tenant_site_position' });

  await qi.createTable('documents', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    fileId: { type: DataTypes.STRING(80), allowNull: false },
    contentType: { type: DataTypes.STRING(80), allowNull: false },
    sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
    originalName: { type: DataTypes.STRING(255), allowNull: false, defaultValue: '' },
    sharedWithClient: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    uploadedById: { type: DataTypes.UUID, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('documents', ['tenantId', 'siteId'], { name: 'documents_tenant_site' });

  await qi.createTable('panels', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    label: { type: DataTypes.STRING(60), allowNull: false },
    makeModel: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    zoneCapacity: { type: DataTypes.INTEGER, allowNull: false },
    wirelessZoneFrom: { type: DataTypes.INTEGER, allowNull: false },
    wirelessZoneTo: { type: DataTypes.INTEGER, allowNull: false },
    commPath: { type: DataTypes.STRING(20), allowNull: false },
    installedOn: { type: DataTypes.DATEONLY, allowNull: true },
    settings: { type: DataTypes.JSON, allowNull: false },
    programmedAt: { type: DataTypes.DATE, allowNull: true },
    changedSinceProgrammed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ...timestamps,
  });
  await qi.addIndex('panels', ['tenantId', 'siteId'], { name: 'panels_tenant_site' });

  await qi.createTable('zones', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    panelId: { type: DataTypes.UUID, allowNull: false, references: { model: 'panels', key: 'id' }, onDelete: 'CASCADE' },
    number: { type: DataTypes.INTEGER, allowNull: false },
    description: { type: DataTypes.STRING(40), allowNull: false },
    deviceType: { type: DataTypes.STRING(30), allowNull: false },
    zoneType: { type: DataTypes.STRING(30), allowNull: false },
    serial: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
    input: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    reportsToMonitoring: { type: DataTypes.BOOLEAN, allowNull: false },
    chime: { type: DataTypes.BOOLEAN, allowNull: false },
    supervised: { type: DataTypes.BOOLEAN, allowNull: false },
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'active' },
    roomId: { type: DataTypes.UUID, allowNull: true },
    openingId: { type: DataTypes.UUID, allowNull: true },
    installedOn: { type: DataTypes.DATEONLY, allowNull: true },
    batteryType: { type: DataTypes.STRING(30), allowNull: true },
    batteryChangedOn: { type: DataTypes.DATEONLY, allowNull: true },
    manufacturedOn: { type: DataTypes.DATEONLY, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('zones', ['tenantId', 'panelId', 'number'], { name: 'zones_tenant_panel_number' });
  await qi.addIndex('zones', ['tenantId', 'serial'], { name: 'zones_tenant_serial' });

  await qi.createTable('zone_changes', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    panelId: { type: DataTypes.UUID, allowNull: false, references: { model: 'panels', key: 'id' }, onDelete: 'CASCADE' },
    zoneId: { type: DataTypes.UUID, allowNull: true },
    zoneNumber: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING(20), allowNull: false },
    changes: { type: DataTypes.JSON, allowNull: false },
    actorId: { type: DataTypes.UUID, allowNull: true },
    actorName: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('zone_changes', ['tenantId', 'panelId', 'createdAt'], { name: 'zone_changes_tenant_panel_created' });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('zone_changes');
  await qi.dropTable('zones');
  await qi.dropTable('panels');
  await qi.dropTable('documents');
  await qi.dropTable('emergency_contacts');
  await qi.dropTable('sites');
  await qi.removeColumn('users', 'clientId');
  await qi.dropTable('clients');
  await qi.removeColumn('tenants', 'upkeepSettings');
}
