import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The mail outbox: every e-mail is written here in the same transaction as the change that
 * causes it, then sent (and retried) by the outbox sender. `key` is unique, so enqueueing
 * the same message twice keeps one row, and the Message-ID derived from it lets the
 * recipient's mail system drop a repeat after a crash mid-send.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('outbox_messages', {
    id: { type: DataTypes.UUID, primaryKey: true },
    // null only for mail that belongs to no firm: an operator's password reset
    tenantId: { type: DataTypes.UUID, allowNull: true, references: { model: 'tenants', key: 'id' }, onDelete: 'CASCADE' },
    key: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    purpose: { type: DataTypes.STRING(40), allowNull: false },
    actorId: { type: DataTypes.UUID, allowNull: true },
    to: { type: DataTypes.STRING(320), allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: false },
    attachments: { type: DataTypes.JSON, allowNull: true },
    state: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE, allowNull: false },
    lastError: { type: DataTypes.TEXT, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('outbox_messages', ['state', 'nextAttemptAt'], { name: 'outbox_messages_due' });
  await qi.addIndex('outbox_messages', ['tenantId', 'purpose', 'to', 'createdAt'], { name: 'outbox_messages_tenant_recipient' });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('outbox_messages');
}
