import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { WalkTestResult } from '@domain/jobs';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** One zone's walk-test result on a job, and whether the monitoring center confirmed the signal. */
export class WalkTest extends TenantModel<InferAttributes<WalkTest>, InferCreationAttributes<WalkTest>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare jobId: string;
  declare zoneId: string;
  declare result: WalkTestResult;
  declare monitoringConfirmed: CreationOptional<boolean>;
  declare note: CreationOptional<string>;
  declare recordedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      WalkTest,
      sequelize,
      {
        jobId: { type: DataTypes.UUID, allowNull: false },
        zoneId: { type: DataTypes.UUID, allowNull: false },
        result: { type: DataTypes.STRING(20), allowNull: false },
        monitoringConfirmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
        recordedById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'walk_tests', modelName: 'WalkTest' },
    );
  }
}
