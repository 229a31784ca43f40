import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '@domain/roles';
import { TenantModel, initTenantModel } from './base/TenantModel';

/** An e-mailed invitation to join a firm as staff or as a client. Only the token's hash is kept. */
export class Invitation extends TenantModel<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedById: string | null;
  /** For role `client`: the client record the new sign-in is linked to. */
  declare clientId: CreationOptional<string | null>;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedUserId: CreationOptional<string | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Invitation,
      sequelize,
      {
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        invitedById: { type: DataTypes.UUID, allowNull: true },
        clientId: { type: DataTypes.UUID, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedUserId: { type: DataTypes.UUID, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'invitations', modelName: 'Invitation' },
    );
  }

  invitationState(now: Date): 'pending' | 'expired' | 'accepted' | 'revoked' {
    if (this.acceptedAt) return 'accepted';
    if (this.revokedAt) return 'revoked';
    if (this.expiresAt.getTime() <= now.getTime()) return 'expired';
    return 'pending';
  }
}
