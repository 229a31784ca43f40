import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A Stripe webhook event already processed. The event id is the key, so a replayed or
 * re-delivered event is recognised and changes nothing. Not firm-scoped: the event arrives
 * before we know whose it is.
 */
export class StripeEvent extends Model<InferAttributes<StripeEvent>, InferCreationAttributes<StripeEvent>> {
  declare id: string;
  declare type: string;
  declare tenantId: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    StripeEvent.init(
      {
        id: { type: DataTypes.STRING(80), primaryKey: true },
        type: { type: DataTypes.STRING(80), allowNull: false },
        tenantId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'stripe_events', modelName: 'StripeEvent', updatedAt: false },
    );
  }
}
