import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

/** A failed sign-in; counted per e-mail and per IP by lib/auth/rate-limit.ts. */
export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare ip: string;
  declare at: CreationOptional<Date>;
}

SignInAttempt.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    email: { type: DataTypes.TEXT, allowNull: false },
    ip: { type: DataTypes.TEXT, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "sign_in_attempts", modelName: "signInAttempt", timestamps: false },
);
