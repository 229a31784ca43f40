import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CommPath } from '@domain/devices';
import type { PanelOccupancy } from '@domain/panel-power';
import type { PanelSettings } from '@domain/schemas/panel';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A control panel at a site, with its zone range and false-alarm-reduction settings. */
export class Panel extends TenantModel<InferAttributes<Panel>, InferCreationAttributes<Panel>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare label: string;
  declare makeModel: CreationOptional<string>;
  declare zoneCapacity: number;
  declare wirelessZoneFrom: number;
  declare wirelessZoneTo: number;
  declare commPath: CommPath;
  declare installedOn: CreationOptional<string | null>;
  declare settings: PanelSettings;
  declare occupancy: CreationOptional<PanelOccupancy>;
  declare standbyCurrentMa: CreationOptional<number | null>;
  declare alarmCurrentMa: CreationOptional<number | null>;
  declare batteryAh: CreationOptional<number | null>;
  declare batteryManufacturedOn: CreationOptional<string | null>;
  declare pathFailureReportMin: CreationOptional<number | null>;
  declare programmedAt: CreationOptional<Date | null>;
  declare changedSinceProgrammed: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Panel,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        label: { type: DataTypes.STRING(60), allowNull: false },
        makeModel: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
        zoneCapacity: { type: DataTypes.INTEGER, allowNull: false },
        wirelessZoneFrom: { type: DataTypes.INTEGER, allowNull: false },
        wirelessZoneTo: { type: DataTypes.INTEGER, allowNull: false },
        commPath: { type: DataTypes.STRING(20), allowNull: false },
        installedOn: { type: DataTypes.DATEONLY, allowNull: true },
        settings: { type: DataTypes.JSON, allowNull: false },
        occupancy: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'household' },
        standbyCurrentMa: { type: DataTypes.DOUBLE, allowNull: true },
        alarmCurrentMa: { type: DataTypes.DOUBLE, allowNull: true },
        batteryAh: { type: DataTypes.DOUBLE, allowNull: true },
        batteryManufacturedOn: { type: DataTypes.DATEONLY, allowNull: true },
        pathFailureReportMin: { type: DataTypes.INTEGER, allowNull: true },
        programmedAt: { type: DataTypes.DATE, allowNull: true },
        changedSinceProgrammed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'panels', modelName: 'Panel' },
    );
  }
}
