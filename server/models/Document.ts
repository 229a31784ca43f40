import { DataTypes, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { TenantModel, initTenantModel } from './base/TenantModel';

export type DocumentKind = 'permit' | 'contract' | 'certificate' | 'photo' | 'floor_plan' | 'other';

/** A file kept for a site (stored under tenants/<tenantId>/), shared with the client or internal. */
export class Document extends TenantModel<InferAttributes<Document>, InferCreationAttributes<Document>> {
  declare id: CreationOptional<string>;
  declare tenantId: string;
  declare siteId: string;
  declare kind: DocumentKind;
  declare title: string;
  declare fileId: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare originalName: CreationOptional<string>;
  declare sharedWithClient: CreationOptional<boolean>;
  declare uploadedById: string | null;
  /** set for a job's photos and files */
  declare jobId: CreationOptional<string | null>;
  declare thumbnailFileId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    initTenantModel(
      Document,
      sequelize,
      {
        siteId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        title: { type: DataTypes.STRING(200), allowNull: false },
        fileId: { type: DataTypes.STRING(80), allowNull: false },
        contentType: { type: DataTypes.STRING(80), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        originalName: { type: DataTypes.STRING(255), allowNull: false, defaultValue: '' },
        sharedWithClient: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        uploadedById: { type: DataTypes.UUID, allowNull: true },
        jobId: { type: DataTypes.UUID, allowNull: true },
        thumbnailFileId: { type: DataTypes.STRING(80), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { tableName: 'documents', modelName: 'Document' },
    );
  }
}
