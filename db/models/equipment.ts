import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

export const EQUIPMENT_KINDS = ["chair", "mill", "furnace"] as const;
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];

export class Equipment extends Model<InferAttributes<Equipment>, InferCreationAttributes<Equipment>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare kind: EquipmentKind;
  declare name: string;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Equipment.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "equipment", modelName: "equipment", freezeTableName: true },
);

/** A chair, mill or furnace out of service for a time range. */
export class EquipmentOutage extends Model<InferAttributes<EquipmentOutage>, InferCreationAttributes<EquipmentOutage>> {
  declare id: CreationOptional<number>;
  declare equipmentId: string;
  declare during: [{ value: Date; inclusive: boolean }, { value: Date; inclusive: boolean }] | [Date, Date];
  declare reason: string | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
}

EquipmentOutage.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    equipmentId: { type: DataTypes.UUID, allowNull: false },
    during: { type: DataTypes.RANGE(DataTypes.DATE), allowNull: false },
    reason: DataTypes.TEXT,
    createdBy: DataTypes.UUID,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "equipment_outages", modelName: "equipmentOutage", updatedAt: false },
);
