import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Site } from "./site";

export class Gateway extends Model<InferAttributes<Gateway>, InferCreationAttributes<Gateway>> {
  declare id: CreationOptional<number>;
  declare siteId: ForeignKey<Site["id"]>;
  declare slug: string;
  declare name: string;
  declare description: CreationOptional<string>;
  declare pollSeconds: CreationOptional<number>;
  /** The bundle of the site's newest release for this gateway (what a pull serves). */
  declare currentBundleId: CreationOptional<number | null>;
  declare runningRelease: CreationOptional<number | null>;
  declare runningDigest: CreationOptional<string | null>;
  declare appliedAt: CreationOptional<Date | null>;
  declare lastCheckInAt: CreationOptional<Date | null>;
  declare lastStatus: CreationOptional<"running" | "failed" | null>;
  declare lastMessage: CreationOptional<string | null>;
  declare failingSince: CreationOptional<Date | null>;
  declare lowerReleaseReported: CreationOptional<number | null>;
  declare unknownTags: CreationOptional<string[] | null>;
  declare failureMailedAt: CreationOptional<Date | null>;
  declare staleMailedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Gateway.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        description: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
        pollSeconds: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 60 },
        currentBundleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        runningRelease: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        runningDigest: { type: DataTypes.CHAR(64), allowNull: true },
        appliedAt: { type: DataTypes.DATE(3), allowNull: true },
        lastCheckInAt: { type: DataTypes.DATE(3), allowNull: true },
        lastStatus: { type: DataTypes.ENUM("running", "failed"), allowNull: true },
        lastMessage: { type: DataTypes.STRING(2000), allowNull: true },
        failingSince: { type: DataTypes.DATE(3), allowNull: true },
        lowerReleaseReported: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        unknownTags: { type: DataTypes.JSON, allowNull: true },
        failureMailedAt: { type: DataTypes.DATE(3), allowNull: true },
        staleMailedAt: { type: DataTypes.DATE(3), allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "gateways", underscored: true },
    );
  }
}
