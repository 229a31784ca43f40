import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';
import type { Client } from './Client';

/**
 * A protected place: address, monitoring account, verbal passcode (encrypted at rest in
 * `passcodeCipher`), access notes, alarm permit and monitoring contract.
 */
export class Site extends TenantModel<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare clientId: string;
  declare name: string;
  declare addressLine1: string;
  declare addressLine2: CreationOptional<string>;
  declare city: string;
  declare region: CreationOptional<string>;
  declare postalCode: CreationOptional<string>;
  declare country: CreationOptional<string>;
  declare timeZone: string;
  declare latitude: CreationOptional<number | null>;
  declare longitude: CreationOptional<number | null>;
  declare monitoringAccount: CreationOptional<string>;
  declare passcodeCipher: CreationOptional<string | null>;
  declare accessNotes: CreationOptional<string>;
  declare permitNumber: CreationOptional<string>;
  declare permitAuthority: CreationOptional<string>;
  declare permitExpiresOn: CreationOptional<string | null>;
  declare contractStartsOn: CreationOptional<string | null>;
  declare contractTermMonths: CreationOptional<number | null>;
  declare contractMonthlyFeeCents: CreationOptional<number | null>;
  declare contractCancelledOn: CreationOptional<string | null>;
  declare contractCancelReason: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare client?: NonAttribute<Client>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Site,
      sequelize,
      {
        clientId: { type: DataTypes.UUID, allowNull: false },
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
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'sites', modelName: 'Site' },
    );
  }
}
