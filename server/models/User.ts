import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { Role } from '@domain/roles';
import type { Tenant } from './Tenant';
import { guardTenantScope } from './base/tenant-guard';

/**
 * A person who signs in. `tenantId` is null only for operators. Users belong to a firm, so
 * queries name the firm (tenant guard) unless deliberately cross-firm (sign-in by e-mail,
 * session lookup, operator console).
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare tenantId: ForeignKey<Tenant['id']> | null;
  /** for role `client`: the client record this homeowner is */
  declare clientId: CreationOptional<string | null>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare deactivatedAt: CreationOptional<Date | null>;
  declare lastSignInAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare tenant?: NonAttribute<Tenant | null>;

  static initModel(sequelize: Sequelize): void {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        tenantId: { type: DataTypes.UUID, allowNull: true },
        clientId: { type: DataTypes.UUID, allowNull: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        deactivatedAt: { type: DataTypes.DATE, allowNull: true },
        lastSignInAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', modelName: 'User' },
    );
    guardTenantScope(User);
  }
}
