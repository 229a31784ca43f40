import { DataTypes, type QueryInterface } from 'sequelize';

/** The firm's own office phone, shown to its clients in the portal beside the monitoring center's. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('tenants', 'phone', { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('tenants', 'phone');
}
