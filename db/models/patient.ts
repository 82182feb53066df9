import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { User } from "./user";

export class Patient extends Model<InferAttributes<Patient>, InferCreationAttributes<Patient>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare clinicId: string;
  declare dateOfBirth: string | null;
  /** E.164, e.g. +16135550134. */
  declare phone: string | null;
  /** Preferred language of pages, e-mails and consent: "en" or "fr". */
  declare language: CreationOptional<"en" | "fr">;
  declare address: CreationOptional<string | null>;
  /** Whether the patient wants visit reminders; new visits start with this choice. */
  declare reminders: CreationOptional<boolean>;
  declare archivedAt: CreationOptional<Date | null>;
  declare firstSignedInAt: CreationOptional<Date | null>;
  declare lastSignedInAt: CreationOptional<Date | null>;
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
    address: DataTypes.TEXT,
    reminders: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    archivedAt: DataTypes.DATE,
    firstSignedInAt: DataTypes.DATE,
    lastSignedInAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "patients", modelName: "patient" },
);
