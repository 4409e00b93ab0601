import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** Sample data saved against a tag group (series stored encoded, see lib/samples/storage.ts). */
export class SampleSet extends Model<InferAttributes<SampleSet>, InferCreationAttributes<SampleSet>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare groupId: number;
  declare name: string;
  declare tagName: string;
  declare kind: "analog" | "discrete" | "counter";
  declare unit: string;
  declare euLow: number | null;
  declare euHigh: number | null;
  declare samplePeriodMs: number;
  declare samples: number;
  declare firstAt: Date;
  declare lastAt: Date;
  declare encoding: string;
  declare data: Buffer;
  declare byteSize: number;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    SampleSet.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        groupId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        tagName: { type: DataTypes.STRING(191), allowNull: false },
        kind: { type: DataTypes.ENUM("analog", "discrete", "counter"), allowNull: false },
        unit: { type: DataTypes.STRING(32), allowNull: false },
        euLow: { type: DataTypes.DOUBLE, allowNull: true },
        euHigh: { type: DataTypes.DOUBLE, allowNull: true },
        samplePeriodMs: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        samples: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        firstAt: { type: DataTypes.DATE(3), allowNull: false },
        lastAt: { type: DataTypes.DATE(3), allowNull: false },
        encoding: { type: DataTypes.STRING(16), allowNull: false },
        data: { type: DataTypes.BLOB("long"), allowNull: false },
        byteSize: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "sample_sets", underscored: true, updatedAt: false },
    );
  }
}
