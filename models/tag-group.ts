import type { Assignment } from "./assignment";
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";

export const RULE_FIELDS = ["pattern", "unit", "kind", "area", "equipment", "gateway", "min_period_ms", "max_period_ms", "include", "exclude"] as const;
export type RuleField = (typeof RULE_FIELDS)[number];

export class TagGroupRule extends Model<InferAttributes<TagGroupRule>, InferCreationAttributes<TagGroupRule>> {
  declare id: CreationOptional<number>;
  declare groupId: number;
  declare position: number;
  declare field: RuleField;
  declare value: string;

  static initModel(sequelize: Sequelize) {
    TagGroupRule.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        groupId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        field: { type: DataTypes.ENUM(...RULE_FIELDS), allowNull: false },
        value: { type: DataTypes.STRING(255), allowNull: false },
      },
      { sequelize, tableName: "tag_group_rules", underscored: true, timestamps: false },
    );
  }
}

export class TagGroup extends Model<InferAttributes<TagGroup>, InferCreationAttributes<TagGroup>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare name: string;
  declare description: CreationOptional<string>;
  declare priority: number;
  declare regulated: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare rules?: NonAttribute<TagGroupRule[]>;
  declare assignment?: NonAttribute<Assignment | null>;

  static initModel(sequelize: Sequelize) {
    TagGroup.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        name: { type: DataTypes.STRING(80), allowNull: false },
        description: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
        priority: { type: DataTypes.INTEGER, allowNull: false },
        regulated: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "tag_groups", underscored: true },
    );
  }
}
