import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

/** Append-only record of who did what to which row, written in the same transaction as the change. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare clinicId: string | null;
  declare actorUserId: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string;
  declare at: CreationOptional<Date>;
  declare ip: string | null;
  declare userAgent: string | null;
  declare data: CreationOptional<Record<string, unknown>>;
}

AuditEvent.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    clinicId: DataTypes.UUID,
    actorUserId: DataTypes.UUID,
    action: { type: DataTypes.TEXT, allowNull: false },
    subjectType: { type: DataTypes.TEXT, allowNull: false },
    subjectId: { type: DataTypes.TEXT, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    ip: DataTypes.TEXT,
    userAgent: DataTypes.TEXT,
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
  },
  { sequelize, tableName: "audit_events", modelName: "auditEvent", timestamps: false },
);
