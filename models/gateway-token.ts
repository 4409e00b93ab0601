import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A gateway's bearer token, kept only as its SHA-256; several may be live during a rotation. */
export class GatewayToken extends Model<InferAttributes<GatewayToken>, InferCreationAttributes<GatewayToken>> {
  declare id: CreationOptional<number>;
  declare gatewayId: number;
  declare tokenHash: string;
  declare prefix: string;
  declare label: CreationOptional<string>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare revokedBy: CreationOptional<number | null>;
  /** After this the gateway API refuses the token; null: it lives until revoked. */
  declare expiresAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    GatewayToken.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        gatewayId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
        prefix: { type: DataTypes.STRING(16), allowNull: false },
        label: { type: DataTypes.STRING(120), allowNull: false, defaultValue: "" },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        lastUsedAt: { type: DataTypes.DATE(3), allowNull: true },
        revokedAt: { type: DataTypes.DATE(3), allowNull: true },
        revokedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        expiresAt: { type: DataTypes.DATE(3), allowNull: true },
      },
      { sequelize, tableName: "gateway_tokens", underscored: true, updatedAt: false },
    );
  }
}

/** One check-in report as the gateway sent it. */
export class GatewayReport extends Model<InferAttributes<GatewayReport>, InferCreationAttributes<GatewayReport>> {
  declare id: CreationOptional<number>;
  declare gatewayId: number;
  declare reportId: string;
  declare release: number;
  declare digest: string;
  declare status: "running" | "failed";
  declare appliedAt: Date;
  declare pointsIn: number;
  declare pointsOut: number;
  declare fromAt: Date;
  declare toAt: Date;
  declare message: string | null;
  declare unknownTags: string[] | null;
  declare lowerRelease: boolean;
  declare receivedAt: Date;

  static initModel(sequelize: Sequelize) {
    GatewayReport.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        gatewayId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        reportId: { type: DataTypes.CHAR(36), allowNull: false },
        release: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        digest: { type: DataTypes.CHAR(64), allowNull: false },
        status: { type: DataTypes.ENUM("running", "failed"), allowNull: false },
        appliedAt: { type: DataTypes.DATE(3), allowNull: false },
        pointsIn: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
        pointsOut: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
        fromAt: { type: DataTypes.DATE(3), allowNull: false },
        toAt: { type: DataTypes.DATE(3), allowNull: false },
        message: { type: DataTypes.STRING(2000), allowNull: true },
        unknownTags: { type: DataTypes.JSON, allowNull: true },
        lowerRelease: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        receivedAt: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: "gateway_reports", underscored: true, timestamps: false },
    );
  }
}
