import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const tenantRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' };

export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('jobs', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    state: { type: DataTypes.STRING(20), allowNull: false },
    scheduledStart: { type: DataTypes.DATE, allowNull: true },
    scheduledEnd: { type: DataTypes.DATE, allowNull: true },
    technicianId: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    summary: { type: DataTypes.STRING(200), allowNull: false },
    clientNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    internalNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    parts: { type: DataTypes.JSON, allowNull: false },
    checklist: { type: DataTypes.JSON, allowNull: false },
    touchedZoneIds: { type: DataTypes.JSON, allowNull: false },
    cancelReason: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    requestedByClient: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    startedAt: { type: DataTypes.DATE, allowNull: true },
    completedAt: { type: DataTypes.DATE, allowNull: true },
    completedById: { type: DataTypes.UUID, allowNull: true },
    reportFileId: { type: DataTypes.STRING(80), allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('jobs', ['tenantId', 'scheduledStart'], { name: 'jobs_tenant_start' });
  await qi.addIndex('jobs', ['tenantId', 'siteId', 'state'], { name: 'jobs_tenant_site_state' });
  await qi.addIndex('jobs', ['tenantId', 'technicianId', 'scheduledStart'], { name: 'jobs_tenant_technician_start' });

  await qi.createTable('walk_tests', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: tenantRef,
    jobId: { type: DataTypes.UUID, allowNull: false, references: { model: 'jobs', key: 'id' }, onDelete: 'CASCADE' },
    zoneId: { type: DataTypes.UUID, allowNull: false, references: { model: 'zones', key: 'id' }, onDelete: 'CASCADE' },
    result: { type: DataTypes.STRING(20), allowNull: false },
    monitoringConfirmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    recordedById: { type: DataTypes.UUID, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('walk_tests', ['tenantId', 'jobId', 'zoneId'], { name: 'walk_tests_tenant_job_zone', unique: true });

  // Job files are documents of the job's site, with the job named; images get a thumbnail.
  await qi.addColumn('documents', 'jobId', { type: DataTypes.UUID, allowNull: true, references: { model: 'jobs', key: 'id' }, onDelete: 'CASCADE' });
  await qi.addColumn('documents', 'thumbnailFileId', { type: DataTypes.STRING(80), allowNull: true });
  await qi.addIndex('documents', ['tenantId', 'jobId'], { name: 'documents_tenant_job' });

  // A firm's checklist per job kind; null = our defaults (src/domain/jobs.ts).
  await qi.addColumn('tenants', 'checklistTemplates', { type: DataTypes.JSON, allowNull: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('tenants', 'checklistTemplates');
  await qi.removeIndex('documents', 'documents_tenant_job');
  await qi.removeColumn('documents', 'thumbnailFileId');
  await qi.removeColumn('documents', 'jobId');
  await qi.dropTable('walk_tests');
  await qi.dropTable('jobs');
}
