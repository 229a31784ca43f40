import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { RoomKind } from '@domain/premises';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** A room on a floor; its kind drives the life-safety rules (bedrooms, garages, fuel-burning appliances). */
export class Room extends TenantModel<InferAttributes<Room>, InferCreationAttributes<Room>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare floorId: string;
  declare name: string;
  declare kind: RoomKind;
  declare fuelBurningAppliance: CreationOptional<boolean>;
  declare attachedGarage: CreationOptional<boolean>;
  /** a bedroom: the hall or landing that serves its sleeping area */
  declare servedByHallId: CreationOptional<string | null>;
  /** a bedroom: its door confirmed within 21 ft of that hall's alarm, along the path of travel */
  declare hallWithin21FtConfirmed: CreationOptional<boolean>;
  /** a bathroom: the bedroom it is attached to */
  declare attachedToBedroomId: CreationOptional<string | null>;
  declare position: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Room,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        floorId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(60), allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        fuelBurningAppliance: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        attachedGarage: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        servedByHallId: { type: DataTypes.UUID, allowNull: true },
        hallWithin21FtConfirmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        attachedToBedroomId: { type: DataTypes.UUID, allowNull: true },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'rooms', modelName: 'Room' },
    );
  }
}
