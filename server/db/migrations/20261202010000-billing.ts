import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Subscriptions: the firm's Stripe customer and subscription, the history of subscription
 * changes kept from webhooks (the operator's MRR chart), and the webhook events already
 * processed (each event id once).
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('tenants', 'stripeCustomerId', { type: DataTypes.STRING(80), allowNull: true });
  await qi.addColumn('tenants', 'stripeSubscriptionId', { type: DataTypes.STRING(80), allowNull: true });
  await qi.addColumn('tenants', 'subscriptionStatus', { type: DataTypes.STRING(30), allowNull: true });
  await qi.addColumn('tenants', 'pastDueSince', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('tenants', 'currentPeriodEnd', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('tenants', 'cancelAtPeriodEnd', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
  await qi.addIndex('tenants', ['stripeCustomerId'], { name: 'tenants_stripe_customer' });

  await qi.createTable('subscription_changes', {
    id: { type: DataTypes.UUID, primaryKey: true },
    tenantId: { type: DataTypes.UUID, allowNull: false, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' },
    planKey: { type: DataTypes.STRING(20), allowNull: true },
    state: { type: DataTypes.STRING(20), allowNull: false },
    monthlyAmountCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    from: { type: DataTypes.DATE, allowNull: false },
    stripeEventId: { type: DataTypes.STRING(80), allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('subscription_changes', ['tenantId', 'from'], { name: 'subscription_changes_tenant_from' });

  await qi.createTable('stripe_events', {
    id: { type: DataTypes.STRING(80), primaryKey: true },
    type: { type: DataTypes.STRING(80), allowNull: false },
    tenantId: { type: DataTypes.UUID, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('stripe_events');
  await qi.dropTable('subscription_changes');
  await qi.removeIndex('tenants', 'tenants_stripe_customer');
  for (const column of ['stripeCustomerId', 'stripeSubscriptionId', 'subscriptionStatus', 'pastDueSince', 'currentPeriodEnd', 'cancelAtPeriodEnd']) {
    await qi.removeColumn('tenants', column);
  }
}
