import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class SignInThrottle extends Model<InferAttributes<SignInThrottle>, InferCreationAttributes<SignInThrottle>> {
  declare throttleKey: string;
  declare failures: number;
  declare lastFailureAt: Date;
  declare blockedUntil: Date;

  static initModel(sequelize: Sequelize) {
    SignInThrottle.init(
      {
        throttleKey: { type: DataTypes.STRING(255), primaryKey: true },
        failures: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        lastFailureAt: { type: DataTypes.DATE(3), allowNull: false },
        blockedUntil: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: "sign_in_throttles", underscored: true, timestamps: false },
    );
  }
}
