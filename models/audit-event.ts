import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type AuditSnapshot = Record<string, unknown> | null;

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare actorId: number | null;
  declare actorEmail: string;
  declare action: string;
  declare entityType: string;
  declare entityId: number | null;
  declare entityLabel: string;
  declare siteId: number | null;
  declare beforeJson: AuditSnapshot;
  declare afterJson: AuditSnapshot;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AuditEvent.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        actorEmail: { type: DataTypes.STRING(191), allowNull: false },
        action: { type: DataTypes.STRING(64), allowNull: false },
        entityType: { type: DataTypes.STRING(32), allowNull: false },
        entityId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        entityLabel: { type: DataTypes.STRING(191), allowNull: false, defaultValue: "" },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        beforeJson: { type: DataTypes.JSON, allowNull: true },
        afterJson: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "audit_events", underscored: true, updatedAt: false },
    );
  }
}
