import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

/** One opening interval on a weekday (0 = Sunday), in clinic-local "HH:MM:SS". */
export class OpeningHour extends Model<InferAttributes<OpeningHour>, InferCreationAttributes<OpeningHour>> {
  declare id: CreationOptional<number>;
  declare clinicId: string;
  declare weekday: number;
  declare opens: string;
  declare closes: string;
}

OpeningHour.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    weekday: { type: DataTypes.SMALLINT, allowNull: false },
    opens: { type: DataTypes.TIME, allowNull: false },
    closes: { type: DataTypes.TIME, allowNull: false },
  },
  { sequelize, tableName: "opening_hours", modelName: "openingHour", timestamps: false },
);

export class ClosedDay extends Model<InferAttributes<ClosedDay>, InferCreationAttributes<ClosedDay>> {
  declare id: CreationOptional<number>;
  declare clinicId: string;
  declare day: string;
  declare reason: string | null;
}

ClosedDay.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    day: { type: DataTypes.DATEONLY, allowNull: false },
    reason: DataTypes.TEXT,
  },
  { sequelize, tableName: "closed_days", modelName: "closedDay", timestamps: false },
);
