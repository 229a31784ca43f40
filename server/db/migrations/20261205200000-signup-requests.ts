import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Sign-up waits for the address to be confirmed: the request (firm name, owner name,
 * password hash) is kept until the owner opens the e-mailed link. No firm exists yet, so
 * there is no tenantId until confirmation fills it in.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('signup_requests', {
    id: { type: DataTypes.UUID, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false },
    firmName: { type: DataTypes.STRING(120), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    passwordHash: { type: DataTypes.STRING(255), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    tenantId: { type: DataTypes.UUID, allowNull: true, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('signup_requests', ['email'], { name: 'signup_requests_email' });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('signup_requests');
}
