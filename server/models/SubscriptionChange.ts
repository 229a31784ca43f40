import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { TenantState } from '@domain/tenant-states';
import { TenantModel, initTenantModel } from './base/TenantModel';

/**
 * One change of a firm's subscription, kept from Stripe's webhooks: from this moment the firm
 * was on this plan, in this state, paying this much a month. The operator's MRR over time is
 * computed from these rows (src/domain/service-revenue.ts).
 */
export class SubscriptionChange extends TenantModel<InferAttributes<SubscriptionChange>, InferCreationAttributes<SubscriptionChange>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare planKey: string | null;
  declare state: TenantState;
  declare monthlyAmountCents: number;
  declare from: Date;
  declare stripeEventId: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      SubscriptionChange,
      sequelize,
      {
        planKey: { type: DataTypes.STRING(20), allowNull: true },
        state: { type: DataTypes.STRING(20), allowNull: false },
        monthlyAmountCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        from: { type: DataTypes.DATE, allowNull: false },
        stripeEventId: { type: DataTypes.STRING(80), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { tableName: 'subscription_changes', modelName: 'SubscriptionChange', updatedAt: false },
    );
  }
}
