import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

/** A crown block used on a visit: its lot (always), and GTIN, expiry and serial when read from the package code. */
export class BlockLot extends Model<InferAttributes<BlockLot>, InferCreationAttributes<BlockLot>> {
  declare id: CreationOptional<number>;
  declare clinicId: string;
  declare appointmentId: string;
  declare patientId: string;
  declare gtin: string | null;
  declare lot: string;
  declare expiry: string | null;
  declare serial: string | null;
  declare elementString: string | null;
  declare source: "code" | "typed";
  declare recordedBy: string | null;
  declare recordedAt: CreationOptional<Date>;
}

BlockLot.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    patientId: { type: DataTypes.UUID, allowNull: false },
    gtin: DataTypes.TEXT,
    lot: { type: DataTypes.TEXT, allowNull: false },
    expiry: DataTypes.DATEONLY,
    serial: DataTypes.TEXT,
    elementString: DataTypes.TEXT,
    source: { type: DataTypes.TEXT, allowNull: false },
    recordedBy: DataTypes.UUID,
    recordedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "block_lots", modelName: "blockLot", timestamps: false },
);
