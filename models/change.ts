import type { SiteConfig } from "@/lib/config/site-config";
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** What a reviewer sees, rendered at submission (see lib/data/change-review.ts). */
export type ChangeReview = {
  release: number;
  issued: string;
  gateways: { gateway: string; before: string | null; after: string }[];
  summary: { kind: string; text: string; group?: string; regulated?: boolean }[];
  regulatedTouched: string[];
  gatewaysAffected: string[];
  impact: unknown;
};

export const CHANGE_STATES = ["draft", "in_review", "approved", "released", "rejected"] as const;
export type ChangeState = (typeof CHANGE_STATES)[number];

export class Change extends Model<InferAttributes<Change>, InferCreationAttributes<Change>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare state: CreationOptional<ChangeState>;
  declare baseRelease: number | null;
  declare createdBy: number | null;
  declare submittedBy: CreationOptional<number | null>;
  declare submittedAt: CreationOptional<Date | null>;
  declare note: CreationOptional<string>;
  /** The configuration as submitted: what is reviewed is what is released. */
  declare config: CreationOptional<SiteConfig | null>;
  /** The rendered review (bundles before/after per gateway, summary, impact) as submitted. */
  declare review: CreationOptional<ChangeReview | null>;
  declare reviewedBy: CreationOptional<number | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewComment: CreationOptional<string>;
  declare rollbackOf: CreationOptional<number | null>;
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
        submittedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        submittedAt: { type: DataTypes.DATE(3), allowNull: true },
        note: { type: DataTypes.STRING(1000), allowNull: false, defaultValue: "" },
        config: { type: DataTypes.JSON, allowNull: true },
        review: { type: DataTypes.JSON, allowNull: true },
        reviewedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        reviewedAt: { type: DataTypes.DATE(3), allowNull: true },
        reviewComment: { type: DataTypes.STRING(2000), allowNull: false, defaultValue: "" },
        rollbackOf: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
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
