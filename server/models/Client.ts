import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';

export type ClientStatus = 'active' | 'cancelled';

/** A firm's client: a household or small business with one or more sites. */
export class Client extends TenantModel<InferAttributes<Client>, InferCreationAttributes<Client>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare name: string;
  declare email: CreationOptional<string>;
  declare phone: CreationOptional<string>;
  declare altPhone: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  declare status: CreationOptional<ClientStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Client,
      sequelize,
      {
        name: { type: DataTypes.STRING(120), allowNull: false },
        email: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
        phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
        altPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'active' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'clients', modelName: 'Client' },
    );
  }
}
