import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../sequelize";

import { ROLES, type Role } from "@/lib/domain/types";

export { ROLES, type Role };

/** A person who signs in. Also the `User` model of next-auth's Sequelize adapter. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string | null;
  declare emailVerified: Date | null;
  declare image: CreationOptional<string | null>;
  declare passwordHash: string | null;
  declare role: CreationOptional<Role>;
  declare clinicId: string | null;
  declare active: CreationOptional<boolean>;
  /** Bumped whenever access changes or the person signs out everywhere; sessions carry the value they began with. */
  declare sessionVersion: CreationOptional<number>;
  /** The two-factor secret, encrypted (lib/auth/two-factor.ts); null until enrolment starts. */
  declare totpSecret: CreationOptional<string | null>;
  declare totpEnabledAt: CreationOptional<Date | null>;
  declare totpLastStep: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    email: {
      type: DataTypes.TEXT,
      allowNull: false,
      unique: true,
      set(value: string) {
        this.setDataValue("email", String(value).trim().toLowerCase());
      },
    },
    name: DataTypes.TEXT,
    emailVerified: DataTypes.DATE,
    image: DataTypes.TEXT,
    passwordHash: DataTypes.TEXT,
    role: { type: DataTypes.TEXT, allowNull: false, defaultValue: "patient" },
    clinicId: DataTypes.UUID,
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    totpSecret: DataTypes.TEXT,
    totpEnabledAt: DataTypes.DATE,
    totpLastStep: { type: DataTypes.BIGINT, get() { const v = this.getDataValue("totpLastStep"); return v == null ? null : Number(v); } },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "users", modelName: "user" },
);
