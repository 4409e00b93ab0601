import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { SiteConfig } from "@/lib/config/site-config";

/** An immutable, numbered snapshot of one site's configuration. */
export class Release extends Model<InferAttributes<Release>, InferCreationAttributes<Release>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare number: number;
  declare config: SiteConfig;
  declare changeId: number | null;
  declare note: CreationOptional<string>;
  declare releasedBy: number | null;
  declare releasedAt: Date;
  declare rollbackOf: CreationOptional<number | null>;
  declare urgentReason: CreationOptional<string | null>;

  static initModel(sequelize: Sequelize) {
    Release.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        config: { type: DataTypes.JSON, allowNull: false },
        changeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
        releasedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        releasedAt: { type: DataTypes.DATE(3), allowNull: false },
        rollbackOf: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        urgentReason: { type: DataTypes.STRING(2000), allowNull: true },
      },
      { sequelize, tableName: "releases", underscored: true, timestamps: false },
    );
  }
}
