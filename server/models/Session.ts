import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A signed-in browser session (express-session's store, connect-session-sequelize). Carries
 * the user's id so a password reset can end every other session of that user. Not
 * firm-owned: a session belongs to a person, and is only ever looked up by its secret id.
 */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare sid: string;
  declare userId: string | null;
  declare expires: Date | null;
  declare data: string | null;

  static initModel(sequelize: Sequelize): void {
    Session.init(
      {
        sid: { type: DataTypes.STRING(36), primaryKey: true },
        userId: { type: DataTypes.UUID, allowNull: true },
        expires: { type: DataTypes.DATE, allowNull: true },
        data: { type: DataTypes.TEXT, allowNull: true },
      },
      { sequelize, tableName: 'sessions', modelName: 'Session' },
    );
  }
}
