import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { DeviceType, ZoneStatus, ZoneType } from '@domain/devices';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A zone enrolled on a panel. `serial` is a string: leading zeros matter. */
export class Zone extends TenantModel<InferAttributes<Zone>, InferCreationAttributes<Zone>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare panelId: string;
  declare number: number;
  declare description: string;
  declare deviceType: DeviceType;
  declare zoneType: ZoneType;
  declare serial: CreationOptional<string>;
  declare input: CreationOptional<number>;
  declare reportsToMonitoring: boolean;
  declare chime: boolean;
  declare supervised: boolean;
  declare status: CreationOptional<ZoneStatus>;
  declare roomId: CreationOptional<string | null>;
  declare openingId: CreationOptional<string | null>;
  declare installedOn: CreationOptional<string | null>;
  declare batteryType: CreationOptional<string | null>;
  declare batteryChangedOn: CreationOptional<string | null>;
  declare manufacturedOn: CreationOptional<string | null>;
  /** pin on a floor plan: floor and fractions of the image (0..1) */
  declare pinFloorId: CreationOptional<string | null>;
  declare pinX: CreationOptional<number | null>;
  declare pinY: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Zone,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        panelId: { type: DataTypes.UUID, allowNull: false },
        number: { type: DataTypes.INTEGER, allowNull: false },
        description: { type: DataTypes.STRING(40), allowNull: false },
        deviceType: { type: DataTypes.STRING(30), allowNull: false },
        zoneType: { type: DataTypes.STRING(30), allowNull: false },
        serial: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
        input: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        reportsToMonitoring: { type: DataTypes.BOOLEAN, allowNull: false },
        chime: { type: DataTypes.BOOLEAN, allowNull: false },
        supervised: { type: DataTypes.BOOLEAN, allowNull: false },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'active' },
        roomId: { type: DataTypes.UUID, allowNull: true },
        openingId: { type: DataTypes.UUID, allowNull: true },
        installedOn: { type: DataTypes.DATEONLY, allowNull: true },
        batteryType: { type: DataTypes.STRING(30), allowNull: true },
        batteryChangedOn: { type: DataTypes.DATEONLY, allowNull: true },
        manufacturedOn: { type: DataTypes.DATEONLY, allowNull: true },
        pinFloorId: { type: DataTypes.UUID, allowNull: true },
        pinX: { type: DataTypes.DOUBLE, allowNull: true },
        pinY: { type: DataTypes.DOUBLE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'zones', modelName: 'Zone' },
    );
  }
}
