import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { guardTenantScope } from './base/tenant-guard';

/**
 * Who changed what, when. `tenantId` is the firm the event concerns; it is null only for
 * service-wide events (an operator account created). Reads name the firm, or are
 * deliberately cross-firm in the operator console.
 */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare tenantId: string | null;
  declare actorId: string | null;
  declare actorRole: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string | null;
  declare details: Record<string, unknown> | null;
  declare ip: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditEvent.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        tenantId: { type: DataTypes.UUID, allowNull: true },
        actorId: { type: DataTypes.UUID, allowNull: true },
        actorRole: { type: DataTypes.STRING(20), allowNull: true },
        action: { type: DataTypes.STRING(60), allowNull: false },
        subjectType: { type: DataTypes.STRING(40), allowNull: false },
        subjectId: { type: DataTypes.UUID, allowNull: true },
        details: { type: DataTypes.JSON, allowNull: true },
        ip: { type: DataTypes.STRING(64), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_events', modelName: 'AuditEvent', updatedAt: false },
    );
    guardTenantScope(AuditEvent);
  }
}
