import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A level of a site's premises; may carry a floor-plan image (stored under tenants/). */
export class Floor extends TenantModel<InferAttributes<Floor>, InferCreationAttributes<Floor>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare name: string;
  declare level: number;
  declare belowGrade: CreationOptional<boolean>;
  declare planImageId: CreationOptional<string | null>;
  declare planImageContentType: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Floor,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(60), allowNull: false },
        level: { type: DataTypes.INTEGER, allowNull: false },
        belowGrade: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        planImageId: { type: DataTypes.STRING(80), allowNull: true },
        planImageContentType: { type: DataTypes.STRING(40), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'floors', modelName: 'Floor' },
    );
  }
}
