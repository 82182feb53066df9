import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

export const MAIL_KINDS = [
  "visit_requested", "visit_confirmed", "visit_moved", "visit_declined", "visit_cancelled", "reminder", "aftercare", "consent_copy",
  "deposit_paid", "deposit_refunded",
] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

export const OUTBOX_STATES = ["pending", "queued", "sent", "skipped", "failed", "cancelled"] as const;
export type OutboxState = (typeof OUTBOX_STATES)[number];

export type AttemptOutcome = "sent" | "retrying" | "failed" | "skipped";

/** A message to send, written in the same transaction as the visit change that causes it. */
export class MailOutbox extends Model<InferAttributes<MailOutbox>, InferCreationAttributes<MailOutbox>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare appointmentId: string;
  declare kind: MailKind;
  declare hoursBefore: number | null;
  declare visitStartsAt: Date;
  declare idempotencyKey: string;
  declare dueAt: Date;
  declare state: CreationOptional<OutboxState>;
  declare stateReason: CreationOptional<string | null>;
  declare jobId: CreationOptional<string | null>;
  declare data: CreationOptional<Record<string, unknown>>;
  declare attachment: CreationOptional<Buffer | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

MailOutbox.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    hoursBefore: DataTypes.SMALLINT,
    visitStartsAt: { type: DataTypes.DATE, allowNull: false },
    idempotencyKey: { type: DataTypes.TEXT, allowNull: false },
    dueAt: { type: DataTypes.DATE, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "pending" },
    stateReason: DataTypes.TEXT,
    jobId: DataTypes.UUID,
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    attachment: DataTypes.BLOB,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "mail_outbox", modelName: "mailOutbox", freezeTableName: true },
);

/** One try at sending one outbox message, with what happened. */
export class MailAttempt extends Model<InferAttributes<MailAttempt>, InferCreationAttributes<MailAttempt>> {
  declare id: CreationOptional<number>;
  declare outboxId: string;
  declare appointmentId: string;
  declare attempt: number;
  declare outcome: AttemptOutcome;
  declare detail: string | null;
  declare at: CreationOptional<Date>;
}

MailAttempt.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    outboxId: { type: DataTypes.UUID, allowNull: false },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    attempt: { type: DataTypes.SMALLINT, allowNull: false },
    outcome: { type: DataTypes.TEXT, allowNull: false },
    detail: DataTypes.TEXT,
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "mail_attempts", modelName: "mailAttempt", timestamps: false },
);
