import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** One entry of a panel's zone change log: who changed which zone, when, old → new. */
export class ZoneChange extends TenantModel<InferAttributes<ZoneChange>, InferCreationAttributes<ZoneChange>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare panelId: string;
  declare zoneId: string | null;
  declare zoneNumber: number | null;
  declare action: 'created' | 'updated' | 'removed' | 'deleted' | 'imported' | 'programmed';
  declare changes: Record<string, [unknown, unknown]>;
  declare actorId: string | null;
  declare actorName: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      ZoneChange,
      sequelize,
      {
        panelId: { type: DataTypes.UUID, allowNull: false },
        zoneId: { type: DataTypes.UUID, allowNull: true },
        zoneNumber: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(20), allowNull: false },
        changes: { type: DataTypes.JSON, allowNull: false },
        actorId: { type: DataTypes.UUID, allowNull: true },
        actorName: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
      },
      { tableName: 'zone_changes', modelName: 'ZoneChange', updatedAt: false },
    );
  }
}
