import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One gateway's signed bundle of one release: the exact bytes served. */
export class Bundle extends Model<InferAttributes<Bundle>, InferCreationAttributes<Bundle>> {
  declare id: CreationOptional<number>;
  declare releaseId: number;
  declare gatewayId: number;
  declare gatewaySlug: string;
  declare digest: string;
  declare keyId: string;
  declare signature: string;
  declare bytes: Buffer;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Bundle.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        releaseId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        gatewayId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        gatewaySlug: { type: DataTypes.STRING(64), allowNull: false },
        digest: { type: DataTypes.CHAR(64), allowNull: false },
        keyId: { type: DataTypes.STRING(64), allowNull: false },
        signature: { type: DataTypes.STRING(200), allowNull: false },
        bytes: { type: DataTypes.BLOB("long"), allowNull: false },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "bundles", underscored: true, updatedAt: false },
    );
  }
}
