import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { OpeningKind } from '@domain/premises';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A door, window, sliding door, garage door or skylight of a room. */
export class Opening extends TenantModel<InferAttributes<Opening>, InferCreationAttributes<Opening>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare roomId: string;
  declare kind: OpeningKind;
  declare label: string;
  declare groundReachable: CreationOptional<boolean>;
  declare position: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Opening,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        roomId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        label: { type: DataTypes.STRING(60), allowNull: false },
        groundReachable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'openings', modelName: 'Opening' },
    );
  }
}
