import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A person the monitoring center calls, in order (position 1 is called first). */
export class EmergencyContact extends TenantModel<InferAttributes<EmergencyContact>, InferCreationAttributes<EmergencyContact>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare position: number;
  declare name: string;
  declare relation: CreationOptional<string>;
  declare phone: string;
  declare altPhone: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      EmergencyContact,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        relation: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
        phone: { type: DataTypes.STRING(40), allowNull: false },
        altPhone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'emergency_contacts', modelName: 'EmergencyContact' },
    );
  }
}
