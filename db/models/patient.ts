import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { User } from "./user";

export class Patient extends Model<InferAttributes<Patient>, InferCreationAttributes<Patient>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare clinicId: string;
  declare dateOfBirth: string | null;
  declare phone: string | null;
  /** Preferred language of pages, e-mails and consent: "en" or "fr". */
  declare language: CreationOptional<"en" | "fr">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;
}

Patient.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false, unique: true },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    dateOfBirth: DataTypes.DATEONLY,
    phone: DataTypes.TEXT,
    language: { type: DataTypes.TEXT, allowNull: false, defaultValue: "en" },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "patients", modelName: "patient" },
);
