import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { TenantState } from '@domain/tenant-states';

/**
 * A firm: the tenant every firm-owned row points at. The tenants table itself is read by
 * id (the firm's own) or across firms by the operator console (`crossTenant`).
 */
export class Tenant extends Model<InferAttributes<Tenant>, InferCreationAttributes<Tenant>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare shortName: string;
  declare state: CreationOptional<TenantState>;
  declare planKey: CreationOptional<string | null>;
  declare trialEndsAt: CreationOptional<Date | null>;
  declare suspendedAt: CreationOptional<Date | null>;
  declare suspendedReason: CreationOptional<string | null>;
  declare stateBeforeSuspension: CreationOptional<TenantState | null>;
  declare timeZone: CreationOptional<string>;
  declare licenceNumber: CreationOptional<string>;
  /** the firm's office phone, for its clients */
  declare phone: CreationOptional<string>;
  declare monitoringCenterName: CreationOptional<string>;
  declare monitoringCenterPhone: CreationOptional<string>;
  declare accentColor: CreationOptional<string>;
  declare logoFileId: CreationOptional<string | null>;
  declare logoContentType: CreationOptional<string | null>;
  /** firm overrides of the upkeep model (battery life, smoke/CO end of life); null = defaults */
  declare upkeepSettings: CreationOptional<Record<string, unknown> | null>;
  /** the firm's checklist per job kind; null = defaults */
  declare checklistTemplates: CreationOptional<Record<string, string[]> | null>;
  /** Stripe: the firm's customer and subscription, as webhooks last told us */
  declare stripeCustomerId: CreationOptional<string | null>;
  declare stripeSubscriptionId: CreationOptional<string | null>;
  declare subscriptionStatus: CreationOptional<string | null>;
  /** when the firm went past due; the grace period counts from here */
  declare pastDueSince: CreationOptional<Date | null>;
  declare currentPeriodEnd: CreationOptional<Date | null>;
  declare cancelAtPeriodEnd: CreationOptional<boolean>;
  /** the latest Checkout Session started for the firm; a new checkout closes it first */
  declare pendingCheckoutSessionId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Tenant.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
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
        phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
        monitoringCenterName: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
        monitoringCenterPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
        accentColor: { type: DataTypes.STRING(7), allowNull: false, defaultValue: '#8f5c17' },
        logoFileId: { type: DataTypes.STRING(80), allowNull: true },
        logoContentType: { type: DataTypes.STRING(40), allowNull: true },
        upkeepSettings: { type: DataTypes.JSON, allowNull: true },
        checklistTemplates: { type: DataTypes.JSON, allowNull: true },
        stripeCustomerId: { type: DataTypes.STRING(80), allowNull: true },
        stripeSubscriptionId: { type: DataTypes.STRING(80), allowNull: true },
        subscriptionStatus: { type: DataTypes.STRING(30), allowNull: true },
        pastDueSince: { type: DataTypes.DATE, allowNull: true },
        currentPeriodEnd: { type: DataTypes.DATE, allowNull: true },
        cancelAtPeriodEnd: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        pendingCheckoutSessionId: { type: DataTypes.STRING(120), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'tenants', modelName: 'Tenant' },
    );
  }
}
