import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type DefaultHandling = "pass-through" | "drop" | "profile";

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<number>;
  declare slug: string;
  declare name: string;
  declare timeZone: string;
  declare uplinkBudgetKbps: number;
  declare storagePricePerGbMonth: number;
  declare retentionMonths: number;
  declare defaultHandling: CreationOptional<DefaultHandling>;
  /** Plain byte model: bytes per sample (timestamp, value, framing). */
  declare bytesPerSample: CreationOptional<number>;
  declare transportOverheadPct: CreationOptional<number>;
  /** Share of the uplink budget kept free, in percent. */
  declare uplinkHeadroomPct: CreationOptional<number>;
  /** The number of the site's latest release (0 before the first). */
  declare releaseCounter: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Site.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        timeZone: { type: DataTypes.STRING(64), allowNull: false },
        uplinkBudgetKbps: { type: DataTypes.DECIMAL(12, 3), allowNull: false },
        storagePricePerGbMonth: { type: DataTypes.DECIMAL(12, 4), allowNull: false },
        retentionMonths: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        defaultHandling: { type: DataTypes.ENUM("pass-through", "drop", "profile"), allowNull: false, defaultValue: "pass-through" },
        bytesPerSample: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 16 },
        transportOverheadPct: { type: DataTypes.DECIMAL(6, 2), allowNull: false, defaultValue: 10 },
        uplinkHeadroomPct: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 20 },
        releaseCounter: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: "sites", underscored: true },
    );
  }
}
