import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Profile as ProfileDocument } from "@/lib/reduction/profile";

/** A reusable reduction profile; its content is in its revisions. */
export class ReductionProfile extends Model<InferAttributes<ReductionProfile>, InferCreationAttributes<ReductionProfile>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare description: CreationOptional<string>;
  /** Comma-separated tag kinds of the latest revision. */
  declare kinds: string;
  declare latestRevision: number;
  declare archivedAt: CreationOptional<Date | null>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare revisions?: NonAttribute<ProfileRevision[]>;

  static initModel(sequelize: Sequelize) {
    ReductionProfile.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        description: { type: DataTypes.STRING(2000), allowNull: false, defaultValue: "" },
        kinds: { type: DataTypes.STRING(40), allowNull: false },
        latestRevision: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        archivedAt: { type: DataTypes.DATE(3), allowNull: true },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "profiles", underscored: true },
    );
  }
}

/** One immutable save of a profile. */
export class ProfileRevision extends Model<InferAttributes<ProfileRevision>, InferCreationAttributes<ProfileRevision>> {
  declare id: CreationOptional<number>;
  declare profileId: number;
  declare number: number;
  declare document: ProfileDocument;
  declare note: CreationOptional<string>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare profile?: NonAttribute<ReductionProfile>;

  static initModel(sequelize: Sequelize) {
    ProfileRevision.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        profileId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        document: { type: DataTypes.JSON, allowNull: false },
        note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "profile_revisions", underscored: true, updatedAt: false },
    );
  }
}
