import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type TagKind = "analog" | "discrete" | "counter";

export class Tag extends Model<InferAttributes<Tag>, InferCreationAttributes<Tag>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare gatewayId: number;
  declare name: string;
  declare unit: string;
  declare samplePeriodMs: number;
  declare kind: TagKind;
  declare euLow: number | null;
  declare euHigh: number | null;
  declare area: string | null;
  declare equipment: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Tag.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        gatewayId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        name: { type: DataTypes.STRING(191), allowNull: false },
        unit: { type: DataTypes.STRING(32), allowNull: false },
        samplePeriodMs: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        kind: { type: DataTypes.ENUM("analog", "discrete", "counter"), allowNull: false },
        euLow: { type: DataTypes.DOUBLE, allowNull: true },
        euHigh: { type: DataTypes.DOUBLE, allowNull: true },
        area: { type: DataTypes.STRING(64), allowNull: true },
        equipment: { type: DataTypes.STRING(64), allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "tags", underscored: true },
    );
  }
}
