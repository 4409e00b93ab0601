import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const CHANGE_STATES = ["draft", "in_review", "approved", "released", "rejected"] as const;
export type ChangeState = (typeof CHANGE_STATES)[number];

export class Change extends Model<InferAttributes<Change>, InferCreationAttributes<Change>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare state: CreationOptional<ChangeState>;
  declare baseRelease: number | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Change.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        state: { type: DataTypes.ENUM(...CHANGE_STATES), allowNull: false, defaultValue: "draft" },
        baseRelease: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "changes", underscored: true },
    );
  }
}

export class ChangeAuthor extends Model<InferAttributes<ChangeAuthor>, InferCreationAttributes<ChangeAuthor>> {
  declare changeId: number;
  declare userId: number;
  declare firstEditAt: Date;
  declare lastEditAt: Date;

  static initModel(sequelize: Sequelize) {
    ChangeAuthor.init(
      {
        changeId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        firstEditAt: { type: DataTypes.DATE(3), allowNull: false },
        lastEditAt: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: "change_authors", underscored: true, timestamps: false },
    );
  }
}
