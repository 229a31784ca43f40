import { DataTypes, Model, type ModelAttributes, type ModelStatic, type Sequelize } from 'sequelize';
import { guardTenantScope } from './tenant-guard';

/**
 * The base of every firm-owned model: UUID key, NOT NULL indexed `tenantId`, timestamps,
 * and the fail-closed tenant guard on every query (see tenant-guard.ts).
 */
export abstract class TenantModel<A extends object = object, C extends object = A> extends Model<A, C> {
  declare tenantId: string;
}

export function initTenantModel(
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  model: ModelStatic<any>,
  sequelize: Sequelize,
  attributes: ModelAttributes,
  options: { tableName: string; modelName: string; timestamps?: boolean; updatedAt?: boolean | string },
): void {
  model.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      tenantId: { type: DataTypes.UUID, allowNull: false },
      ...attributes,
    },
    { sequelize, ...options },
  );
  guardTenantScope(model);
}
