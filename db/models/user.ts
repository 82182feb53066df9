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
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "users", modelName: "user" },
);
