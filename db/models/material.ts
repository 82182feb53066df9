import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { Cementation, Fabrication, FinishingKind, HeatTreatment, Mode, ToothClass } from "@/lib/domain/types";

export type MaterialTexts = { description: string; pros: string[]; cautions: string[] };
export type MaterialTranslations = Partial<Record<"fr", MaterialTexts & { name?: string }>>;

/** A crown material in a clinic's catalogue (generic names only). Editable data, not code. */
export class Material extends Model<InferAttributes<Material>, InferCreationAttributes<Material>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare key: string;
  declare name: string;
  declare iso6872Class: number | null;
  declare flexuralStrengthMpa: number | null;
  declare toothClasses: ToothClass[];
  declare cementation: Cementation[];
  declare fabrication: Fabrication;
  declare heatTreatment: HeatTreatment;
  declare minThicknessMm: number;
  declare description: string;
  declare pros: string[];
  declare cautions: string[];
  /** The patient-facing texts in other languages; English is in the columns above. */
  declare translations: CreationOptional<MaterialTranslations>;
  declare provisionalOnly: CreationOptional<boolean>;
  /** The visit's stages in order (see lib/domain/timeline.ts `checkStageOrder`). */
  declare stageOrder: CreationOptional<string[]>;
  declare active: CreationOptional<boolean>;
  declare sortOrder: CreationOptional<number>;
  /** The clinic's list price for a crown in this material (cents, clinic currency); null when not set. */
  declare listFeeCents: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare modes?: NonAttribute<MaterialMode[]>;
}

Material.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    key: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    iso6872Class: { type: DataTypes.SMALLINT, field: "iso6872_class" },
    flexuralStrengthMpa: DataTypes.INTEGER,
    toothClasses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    cementation: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    fabrication: { type: DataTypes.TEXT, allowNull: false },
    heatTreatment: { type: DataTypes.TEXT, allowNull: false },
    minThicknessMm: {
      type: DataTypes.DECIMAL(3, 1),
      allowNull: false,
      get() {
        return Number(this.getDataValue("minThicknessMm"));
      },
    },
    description: { type: DataTypes.TEXT, allowNull: false },
    pros: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    translations: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    cautions: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    provisionalOnly: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    stageOrder: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    listFeeCents: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "materials", modelName: "material" },
);

/** Minutes of fabrication, heat treatment and finishing for one material in one finishing mode. */
export class MaterialMode extends Model<InferAttributes<MaterialMode>, InferCreationAttributes<MaterialMode>> {
  declare id: CreationOptional<number>;
  declare materialId: string;
  declare mode: Mode;
  declare fabricationMinutes: number;
  declare heatTreatmentMinutes: number;
  declare finishing: FinishingKind;
  declare finishingMinutes: number;
  declare glazeFiringMinutes: CreationOptional<number>;
  /** Furnace programmes for the heat treatment and the separate glaze firing; null: any furnace. */
  declare heatProgrammeId: CreationOptional<string | null>;
  declare glazeProgrammeId: CreationOptional<string | null>;
}

MaterialMode.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    materialId: { type: DataTypes.UUID, allowNull: false },
    mode: { type: DataTypes.TEXT, allowNull: false },
    fabricationMinutes: { type: DataTypes.INTEGER, allowNull: false },
    heatTreatmentMinutes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    finishing: { type: DataTypes.TEXT, allowNull: false },
    finishingMinutes: { type: DataTypes.INTEGER, allowNull: false },
    glazeFiringMinutes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    heatProgrammeId: DataTypes.UUID,
    glazeProgrammeId: DataTypes.UUID,
  },
  { sequelize, tableName: "material_modes", modelName: "materialMode", timestamps: false },
);

/** Clinic-wide minutes per stage; a row with a tooth class overrides the general row. */
export class StageDuration extends Model<InferAttributes<StageDuration>, InferCreationAttributes<StageDuration>> {
  declare id: CreationOptional<number>;
  declare clinicId: string;
  declare stage: string;
  declare toothClass: ToothClass | null;
  declare minutes: number;
}

StageDuration.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    stage: { type: DataTypes.TEXT, allowNull: false },
    toothClass: DataTypes.TEXT,
    minutes: { type: DataTypes.INTEGER, allowNull: false },
  },
  { sequelize, tableName: "stage_durations", modelName: "stageDuration", timestamps: false },
);

/** A furnace programme the clinic runs (its own name and minutes) and the furnaces able to run it. */
export class FurnaceProgramme extends Model<InferAttributes<FurnaceProgramme>, InferCreationAttributes<FurnaceProgramme>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare name: string;
  declare minutes: number;
  declare furnaceIds: CreationOptional<string[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

FurnaceProgramme.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    minutes: { type: DataTypes.INTEGER, allowNull: false },
    furnaceIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "furnace_programmes", modelName: "furnaceProgramme" },
);
