import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { Mode } from "@/lib/domain/types";
import type { Material } from "./material";
import type { Patient } from "./patient";
import type { User } from "./user";

/** A crown the dentist recommends for one tooth, with the materials and modes the patient may choose. */
export class Proposal extends Model<InferAttributes<Proposal>, InferCreationAttributes<Proposal>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare patientId: string;
  declare dentistId: string;
  declare tooth: number;
  declare feeCents: number;
  declare note: string | null;
  declare status: CreationOptional<"open" | "closed">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare options?: NonAttribute<ProposalMaterial[]>;
  declare patient?: NonAttribute<Patient>;
  declare dentist?: NonAttribute<User>;
}

Proposal.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    patientId: { type: DataTypes.UUID, allowNull: false },
    dentistId: { type: DataTypes.UUID, allowNull: false },
    tooth: { type: DataTypes.SMALLINT, allowNull: false },
    feeCents: { type: DataTypes.INTEGER, allowNull: false },
    note: DataTypes.TEXT,
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "open" },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "proposals", modelName: "proposal" },
);

export class ProposalMaterial extends Model<InferAttributes<ProposalMaterial>, InferCreationAttributes<ProposalMaterial>> {
  declare id: CreationOptional<number>;
  declare proposalId: string;
  declare materialId: string;
  declare modes: Mode[];
  /** This material's fee for this proposal (cents); null means the proposal's fee. */
  declare feeCents: CreationOptional<number | null>;
  declare material?: NonAttribute<Material>;
}

ProposalMaterial.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    proposalId: { type: DataTypes.UUID, allowNull: false },
    materialId: { type: DataTypes.UUID, allowNull: false },
    modes: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    feeCents: DataTypes.INTEGER,
  },
  { sequelize, tableName: "proposal_materials", modelName: "proposalMaterial", timestamps: false },
);
