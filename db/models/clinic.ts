import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

/** Per-clinic booking and reminder settings; defaults live in lib/domain/clinic-settings.ts. */
export type ClinicSettingsJson = Partial<{
  slotMinutes: number;
  bufferMinutes: number;
  minNoticeMinutes: number;
  cancelCutoffHours: number;
  reminderHoursBefore: number[];
}>;

export class Clinic extends Model<InferAttributes<Clinic>, InferCreationAttributes<Clinic>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare slug: string;
  declare timeZone: string;
  declare address: string;
  declare phone: string | null;
  declare currency: CreationOptional<string>;
  /** ISO 3166-2 code of the clinic's province or state, e.g. "CA-ON" (lib/domain/jurisdiction.ts). */
  declare jurisdiction: CreationOptional<string>;
  declare settings: CreationOptional<ClinicSettingsJson>;
  /** Staff must sign in with a one-time code besides their password (on for a new clinic). */
  declare requireTwoFactor: CreationOptional<boolean>;
  declare depositKind: CreationOptional<"none" | "fixed" | "percent">;
  /** Cents for a fixed deposit, whole percent of the patient's share for a percentage. */
  declare depositValue: CreationOptional<number>;
  declare depositRefundHours: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Clinic.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    name: { type: DataTypes.TEXT, allowNull: false },
    slug: { type: DataTypes.TEXT, allowNull: false, unique: true },
    timeZone: { type: DataTypes.TEXT, allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: false },
    phone: DataTypes.TEXT,
    currency: { type: DataTypes.CHAR(3), allowNull: false, defaultValue: "CAD" },
    jurisdiction: { type: DataTypes.TEXT, allowNull: false, defaultValue: "CA-ON" },
    settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    requireTwoFactor: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    depositKind: { type: DataTypes.TEXT, allowNull: false, defaultValue: "none" },
    depositValue: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    depositRefundHours: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 48 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "clinics", modelName: "clinic" },
);
