import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A sign-up waiting for its address to be confirmed: single-use, expiring, only the token's
 * hash kept. It belongs to no firm until confirmation creates one (then tenantId is set);
 * it is looked up by token hash, which is unguessable.
 */
export class SignupRequest extends Model<InferAttributes<SignupRequest>, InferCreationAttributes<SignupRequest>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare firmName: string;
  declare name: string;
  declare passwordHash: string;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare tenantId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    SignupRequest.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.STRING(254), allowNull: false },
        firmName: { type: DataTypes.STRING(120), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        tenantId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'signup_requests', modelName: 'SignupRequest' },
    );
  }
}
