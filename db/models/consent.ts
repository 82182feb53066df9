import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../sequelize";
import type { ConsentFlag, QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import type { SectionKey, TemplateSection } from "@/lib/domain/consent-text";
import type { Appointment } from "./appointment";

import { CONSENT_STATUSES, type ConsentStatus } from "@/lib/domain/types";

export { CONSENT_STATUSES, type ConsentStatus };

/** One version of a clinic's consent text. Published versions never change (a trigger refuses it). */
export class ConsentTemplate extends Model<InferAttributes<ConsentTemplate>, InferCreationAttributes<ConsentTemplate>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare version: number;
  declare title: string;
  declare sections: TemplateSection[];
  /** The French text of the same version; null only on versions published before French existed. */
  declare titleFr: CreationOptional<string | null>;
  declare sectionsFr: CreationOptional<TemplateSection[] | null>;
  declare status: CreationOptional<"published" | "withdrawn">;
  declare publishedAt: CreationOptional<Date>;
  declare withdrawnAt: CreationOptional<Date | null>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
}

ConsentTemplate.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    sections: { type: DataTypes.JSONB, allowNull: false },
    titleFr: { type: DataTypes.TEXT, field: "title_fr" },
    sectionsFr: { type: DataTypes.JSONB, field: "sections_fr" },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "published" },
    publishedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    withdrawnAt: DataTypes.DATE,
    createdBy: DataTypes.UUID,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "consent_templates", modelName: "consentTemplate", updatedAt: false },
);

/** A visit's informed consent: pending → signed → reviewed, or withdrawn. Never deleted. */
export class Consent extends Model<InferAttributes<Consent>, InferCreationAttributes<Consent>> {
  declare id: CreationOptional<string>;
  declare clinicId: string;
  declare appointmentId: string;
  declare patientId: string;
  declare status: CreationOptional<ConsentStatus>;
  declare templateId: CreationOptional<string | null>;
  declare templateVersion: CreationOptional<number | null>;
  declare answers: CreationOptional<QuestionnaireAnswers | null>;
  declare flags: CreationOptional<ConsentFlag[]>;
  declare acknowledged: CreationOptional<SectionKey[] | null>;
  declare electronicRecordsVersion: CreationOptional<string | null>;
  declare consentText: CreationOptional<string | null>;
  /** The language the patient read and signed (the text and its hash are in it). */
  declare language: CreationOptional<"en" | "fr">;
  declare textSha256: CreationOptional<string | null>;
  declare typedName: CreationOptional<string | null>;
  declare signaturePng: CreationOptional<Buffer | null>;
  declare signedAt: CreationOptional<Date | null>;
  declare signedIp: CreationOptional<string | null>;
  declare signedUserAgent: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewedBy: CreationOptional<string | null>;
  declare reviewedIp: CreationOptional<string | null>;
  declare reviewedUserAgent: CreationOptional<string | null>;
  declare withdrawnAt: CreationOptional<Date | null>;
  declare withdrawnBy: CreationOptional<string | null>;
  declare withdrawnReason: CreationOptional<string | null>;
  /** How the withdrawal reached the clinic, and who made it when staff record it for the patient. */
  declare withdrawnVia: CreationOptional<"online" | "phone" | "in_person" | "in_writing" | null>;
  declare withdrawnByName: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare appointment?: NonAttribute<Appointment>;
  declare template?: NonAttribute<ConsentTemplate>;
  declare pdfs?: NonAttribute<ConsentPdf[]>;
}

Consent.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clinicId: { type: DataTypes.UUID, allowNull: false },
    appointmentId: { type: DataTypes.UUID, allowNull: false },
    patientId: { type: DataTypes.UUID, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "pending" },
    templateId: DataTypes.UUID,
    templateVersion: DataTypes.INTEGER,
    answers: DataTypes.JSONB,
    flags: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    acknowledged: DataTypes.ARRAY(DataTypes.TEXT),
    electronicRecordsVersion: DataTypes.TEXT,
    consentText: DataTypes.TEXT,
    language: { type: DataTypes.TEXT, allowNull: false, defaultValue: "en" },
    textSha256: { type: DataTypes.CHAR(64), field: "text_sha256" },
    typedName: DataTypes.TEXT,
    signaturePng: DataTypes.BLOB,
    signedAt: DataTypes.DATE,
    signedIp: DataTypes.TEXT,
    signedUserAgent: DataTypes.TEXT,
    reviewedAt: DataTypes.DATE,
    reviewedBy: DataTypes.UUID,
    reviewedIp: DataTypes.TEXT,
    reviewedUserAgent: DataTypes.TEXT,
    withdrawnAt: DataTypes.DATE,
    withdrawnBy: DataTypes.UUID,
    withdrawnReason: DataTypes.TEXT,
    withdrawnVia: DataTypes.TEXT,
    withdrawnByName: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "consents", modelName: "consent" },
);

/** One sealed PDF of a consent: version 1 when signed, version 2 when reviewed. Append-only. */
export class ConsentPdf extends Model<InferAttributes<ConsentPdf>, InferCreationAttributes<ConsentPdf>> {
  declare id: CreationOptional<number>;
  declare consentId: string;
  declare version: number;
  declare reason: "signed" | "reviewed";
  declare pdf: Buffer;
  declare contentSha256: string;
  declare sha256: string;
  declare createdAt: CreationOptional<Date>;
}

ConsentPdf.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    consentId: { type: DataTypes.UUID, allowNull: false },
    version: { type: DataTypes.SMALLINT, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    pdf: { type: DataTypes.BLOB, allowNull: false },
    contentSha256: { type: DataTypes.CHAR(64), allowNull: false, field: "content_sha256" },
    sha256: { type: DataTypes.CHAR(64), allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "consent_pdfs", modelName: "consentPdf", updatedAt: false },
);
