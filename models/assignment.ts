import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { ParameterOverride } from "@/lib/reduction/profile";
import type { ProfileRevision } from "./profile";

/** A tag group's pinned profile revision with the group's overrides. */
export class Assignment extends Model<InferAttributes<Assignment>, InferCreationAttributes<Assignment>> {
  declare id: CreationOptional<number>;
  declare groupId: number;
  declare profileRevisionId: number;
  declare overrides: ParameterOverride[];
  declare updatedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare revision?: NonAttribute<ProfileRevision>;
  declare tagOverrides?: NonAttribute<AssignmentTagOverride[]>;

  static initModel(sequelize: Sequelize) {
    Assignment.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        groupId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        profileRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        overrides: { type: DataTypes.JSON, allowNull: false },
        updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "assignments", underscored: true },
    );
  }
}

/** The overrides for one tag of an assigned group. */
export class AssignmentTagOverride extends Model<InferAttributes<AssignmentTagOverride>, InferCreationAttributes<AssignmentTagOverride>> {
  declare assignmentId: number;
  declare tagId: number;
  declare overrides: ParameterOverride[];

  static initModel(sequelize: Sequelize) {
    AssignmentTagOverride.init(
      {
        assignmentId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        tagId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        overrides: { type: DataTypes.JSON, allowNull: false },
      },
      { sequelize, tableName: "assignment_tag_overrides", underscored: true, timestamps: false },
    );
  }
}

/** Who acknowledged which caution text before a lossy step reached a regulated group. */
export class CautionAcknowledgement extends Model<InferAttributes<CautionAcknowledgement>, InferCreationAttributes<CautionAcknowledgement>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare groupId: number | null;
  declare groupName: string;
  declare profileRevisionId: number | null;
  declare cautionId: string;
  declare cautionText: string;
  declare userId: number | null;
  declare userEmail: string;
  declare acknowledgedAt: Date;
  /** Set when a reviewer acknowledged at approval (null: the engineer at assignment). */
  declare changeId: CreationOptional<number | null>;

  static initModel(sequelize: Sequelize) {
    CautionAcknowledgement.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        groupId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        groupName: { type: DataTypes.STRING(80), allowNull: false },
        profileRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        cautionId: { type: DataTypes.STRING(64), allowNull: false },
        cautionText: { type: DataTypes.TEXT, allowNull: false },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        userEmail: { type: DataTypes.STRING(191), allowNull: false },
        acknowledgedAt: { type: DataTypes.DATE(3), allowNull: false },
        changeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      },
      { sequelize, tableName: "caution_acknowledgements", underscored: true, timestamps: false },
    );
  }
}
