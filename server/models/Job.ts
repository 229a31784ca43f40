import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { JobKind, JobState } from '@domain/jobs';
import { TenantModel, initTenantModel } from './base/TenantModel';

export interface JobPart {
  description: string;
  quantity: number;
  unitPriceCents: number;
}
export interface ChecklistItem {
  label: string;
  done: boolean;
}

/** A visit to a site: install, service call, battery change, inspection, takeover or removal. */
export class Job extends TenantModel<InferAttributes<Job>, InferCreationAttributes<Job>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare kind: JobKind;
  declare state: JobState;
  declare scheduledStart: CreationOptional<Date | null>;
  declare scheduledEnd: CreationOptional<Date | null>;
  declare technicianId: CreationOptional<string | null>;
  declare summary: string;
  declare clientNotes: CreationOptional<string>;
  declare internalNotes: CreationOptional<string>;
  declare parts: JobPart[];
  declare checklist: ChecklistItem[];
  declare touchedZoneIds: string[];
  declare cancelReason: CreationOptional<string>;
  declare requestedByClient: CreationOptional<boolean>;
  declare startedAt: CreationOptional<Date | null>;
  declare completedAt: CreationOptional<Date | null>;
  declare completedById: CreationOptional<string | null>;
  declare reportFileId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Job,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        state: { type: DataTypes.STRING(20), allowNull: false },
        scheduledStart: { type: DataTypes.DATE, allowNull: true },
        scheduledEnd: { type: DataTypes.DATE, allowNull: true },
        technicianId: { type: DataTypes.UUID, allowNull: true },
        summary: { type: DataTypes.STRING(200), allowNull: false },
        clientNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        internalNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        parts: { type: DataTypes.JSON, allowNull: false },
        checklist: { type: DataTypes.JSON, allowNull: false },
        touchedZoneIds: { type: DataTypes.JSON, allowNull: false },
        cancelReason: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
        requestedByClient: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        completedAt: { type: DataTypes.DATE, allowNull: true },
        completedById: { type: DataTypes.UUID, allowNull: true },
        reportFileId: { type: DataTypes.STRING(80), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'jobs', modelName: 'Job' },
    );
  }
}
