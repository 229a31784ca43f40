import { DataTypes, type QueryInterface } from 'sequelize';

/** The firm's latest Checkout Session, so a new one can close it first (never two subscriptions). */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('tenants', 'pendingCheckoutSessionId', { type: DataTypes.STRING(120), allowNull: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('tenants', 'pendingCheckoutSessionId');
}
