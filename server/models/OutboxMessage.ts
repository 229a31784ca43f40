import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { guardTenantScope } from './base/tenant-guard';

export type OutboxState = 'pending' | 'sent' | 'failed';

/** An attachment as kept in the outbox: the bytes as base64, so the row alone can be sent. */
export interface StoredAttachment {
  filename: string;
  contentType: string;
  contentBase64: string;
  cid?: string;
}

/**
 * One e-mail waiting to be sent, sent, or given up on. Written in the transaction of the
 * change that causes it (see server/emails/outbox.ts). `tenantId` is the firm the mail
 * belongs to; it is null only for mail that belongs to no firm (an operator's password
 * reset: operators have no firm). The sender reads across firms on purpose (crossTenant);
 * limits count a firm's own rows only.
 */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<string>;
  declare tenantId: string | null;
  declare key: string;
  declare purpose: string;
  declare actorId: string | null;
  declare to: string;
  declare subject: string;
  declare text: string;
  declare html: string;
  declare attachments: StoredAttachment[] | null;
  declare state: CreationOptional<OutboxState>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    OutboxMessage.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        tenantId: { type: DataTypes.UUID, allowNull: true },
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
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'outbox_messages', modelName: 'OutboxMessage' },
    );
    guardTenantScope(OutboxMessage);
  }
}
