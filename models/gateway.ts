import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Site } from "./site";

export class Gateway extends Model<InferAttributes<Gateway>, InferCreationAttributes<Gateway>> {
  declare id: CreationOptional<number>;
  declare siteId: ForeignKey<Site["id"]>;
  declare slug: string;
  declare name: string;
  declare description: CreationOptional<string>;
  declare pollSeconds: CreationOptional<number>;
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
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "gateways", underscored: true },
    );
  }
}
