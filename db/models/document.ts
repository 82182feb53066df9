import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { AllowedContentType, DocumentKind, UploaderRole } from "@/lib/domain/documents";
import type { Patient } from "./patient";
import type { User } from "./user";

/** A file attached to a patient; its bytes are in object storage under `objectKey`. */
export class PatientDocument extends Model<InferAttributes<PatientDocument>, InferCreationAttributes<PatientDocument>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare patientId: string;
  declare uploadedById: string | null;
  declare uploaderRole: UploaderRole;
  declare kind: DocumentKind;
  declare title: string;
  declare objectKey: string;
  declare contentType: AllowedContentType;
  declare byteSize: number;
  declare sha256: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare patient?: NonAttribute<Patient>;
  declare uploadedBy?: NonAttribute<User | null>;
}

PatientDocument.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    patientId: { type: DataTypes.UUID, allowNull: false },
    uploadedById: DataTypes.UUID,
    uploaderRole: { type: DataTypes.TEXT, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    objectKey: { type: DataTypes.TEXT, allowNull: false, unique: true },
    contentType: { type: DataTypes.TEXT, allowNull: false },
    byteSize: { type: DataTypes.INTEGER, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "documents", modelName: "document" },
);
