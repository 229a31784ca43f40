import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const tenantRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' };
const siteRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' };

export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('floors', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: siteRef,
    name: { type: DataTypes.STRING(60), allowNull: false },
    level: { type: DataTypes.INTEGER, allowNull: false },
    belowGrade: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    planImageId: { type: DataTypes.STRING(80), allowNull: true },
    planImageContentType: { type: DataTypes.STRING(40), allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('floors', ['tenantId', 'siteId', 'level'], { name: 'floors_tenant_site_level' });

  await qi.createTable('rooms', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: siteRef,
    floorId: { type: DataTypes.UUID, allowNull: false, references: { model: 'floors', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(60), allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    fuelBurningAppliance: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    attachedGarage: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...timestamps,
  });
  await qi.addIndex('rooms', ['tenantId', 'siteId', 'floorId'], { name: 'rooms_tenant_site_floor' });

  await qi.createTable('openings', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: siteRef,
    roomId: { type: DataTypes.UUID, allowNull: false, references: { model: 'rooms', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    label: { type: DataTypes.STRING(60), allowNull: false },
    groundReachable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...timestamps,
  });
  await qi.addIndex('openings', ['tenantId', 'siteId', 'roomId'], { name: 'openings_tenant_site_room' });

  // A zone's pin on a floor plan: fractions of the image's width and height, so any size renders right.
  await qi.addColumn('zones', 'pinFloorId', { type: DataTypes.UUID, allowNull: true });
  await qi.addColumn('zones', 'pinX', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('zones', 'pinY', { type: DataTypes.DOUBLE, allowNull: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('zones', 'pinY');
  await qi.removeColumn('zones', 'pinX');
  await qi.removeColumn('zones', 'pinFloorId');
  await qi.dropTable('openings');
  await qi.dropTable('rooms');
  await qi.dropTable('floors');
}
