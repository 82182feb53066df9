import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { AppointmentStatus, Mode, ResourceKind } from "@/lib/domain/types";
import type { Material } from "./material";
import type { Patient } from "./patient";
import type { Proposal } from "./proposal";

/** A booked single-visit crown (a "visit" in the product's words). */
export class Appointment extends Model<InferAttributes<Appointment>, InferCreationAttributes<Appointment>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare proposalId: string;
  declare patientId: string;
  declare dentistId: string;
  declare materialId: string;
  declare mode: Mode;
  declare tooth: number;
  declare status: CreationOptional<AppointmentStatus>;
  declare startsAt: Date;
  declare endsAt: Date;
  declare chairId: string;
  declare millId: string;
  declare furnaceId: string | null;
  declare feeCents: number;
  declare statusReason: CreationOptional<string | null>;
  declare remindersEnabled: CreationOptional<boolean>;
  /** VITA classical shade and block size recorded by the dentist; when the block went into the mill. */
  declare shade: CreationOptional<string | null>;
  declare blockSize: CreationOptional<string | null>;
  declare blockLoadedAt: CreationOptional<Date | null>;
  declare blockLoadedBy: CreationOptional<string | null>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare material?: NonAttribute<Material>;
  declare patient?: NonAttribute<Patient>;
  declare proposal?: NonAttribute<Proposal>;
  declare stages?: NonAttribute<AppointmentStage[]>;
}

Appointment.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    proposalId: { type: DataTypes.UUID, allowNull: false },
    patientId: { type: DataTypes.UUID, allowNull: false },
    dentistId: { type: DataTypes.UUID, allowNull: false },
    materialId: { type: DataTypes.UUID, allowNull: false },
    mode: { type: DataTypes.TEXT, allowNull: false },
    tooth: { type: DataTypes.SMALLINT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "requested" },
    startsAt: { type: DataTypes.DATE, allowNull: false },
    endsAt: { type: DataTypes.DATE, allowNull: false },
    chairId: { type: DataTypes.UUID, allowNull: false },
    millId: { type: DataTypes.UUID, allowNull: false },
    furnaceId: DataTypes.UUID,
    feeCents: { type: DataTypes.INTEGER, allowNull: false },
    statusReason: DataTypes.TEXT,
    remindersEnabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    shade: DataTypes.TEXT,
    blockSize: DataTypes.TEXT,
    blockLoadedAt: DataTypes.DATE,
    blockLoadedBy: DataTypes.UUID,
    createdBy: DataTypes.UUID,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "appointments", modelName: "appointment" },
);

/** One planned stage of a visit, with the actual times once staff start and finish it. */
export class AppointmentStage extends Model<InferAttributes<AppointmentStage>, InferCreationAttributes<AppointmentStage>> {
  declare id: CreationOptional<number>;
  declare appointmentId: string;
  declare seq: number;
  declare key: string;
  declare plannedStart: Date;
  declare plannedEnd: Date;
  declare actualStart: CreationOptional<Date | null>;
  declare actualEnd: CreationOptional<Date | null>;
  declare equipment: ResourceKind[];
}

AppointmentStage.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    seq: { type: DataTypes.SMALLINT, allowNull: false },
    key: { type: DataTypes.TEXT, allowNull: false },
    plannedStart: { type: DataTypes.DATE, allowNull: false },
    plannedEnd: { type: DataTypes.DATE, allowNull: false },
    actualStart: DataTypes.DATE,
    actualEnd: DataTypes.DATE,
    equipment: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
  },
  { sequelize, tableName: "appointment_stages", modelName: "appointmentStage", timestamps: false },
);

/** One resource held for one stage window; the exclusion constraint forbids overlaps of active rows. */
export class Reservation extends Model<InferAttributes<Reservation>, InferCreationAttributes<Reservation>> {
  declare id: CreationOptional<number>;
  declare appointmentId: string;
  declare clinicId: string;
  declare resourceKind: ResourceKind;
  declare resourceId: string;
  declare stage: string;
  declare during: [Date, Date] | [{ value: Date; inclusive: boolean }, { value: Date; inclusive: boolean }];
  declare active: CreationOptional<boolean>;
}

Reservation.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    resourceKind: { type: DataTypes.TEXT, allowNull: false },
    resourceId: { type: DataTypes.UUID, allowNull: false },
    stage: { type: DataTypes.TEXT, allowNull: false },
    during: { type: DataTypes.RANGE(DataTypes.DATE), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
  },
  { sequelize, tableName: "reservations", modelName: "reservation", timestamps: false },
);
