// All models and their associations; import models from here so associations are always set up.
import { sequelize } from "../sequelize";
import { AuditEvent } from "./audit-event";
import { BlockLot } from "./block-lot";
import { Appointment, AppointmentStage, Reservation } from "./appointment";
import { Clinic } from "./clinic";
import { ClosedDay, OpeningHour } from "./clinic-hours";
import { Consent, ConsentPdf, ConsentTemplate } from "./consent";
import { registerConsentGuard } from "./consent-guard";
import { PatientDocument } from "./document";
import { Equipment, EquipmentOutage } from "./equipment";
import { MailAttempt, MailOutbox } from "./mail";
import { FurnaceProgramme, Material, MaterialMode, StageDuration } from "./material";
import { Patient } from "./patient";
import { Proposal, ProposalMaterial } from "./proposal";
import { SignInAttempt } from "./sign-in-attempt";
import { User } from "./user";

// Next bundles pages and route handlers into separate module graphs, each with its own copy of
// the model classes; so whether this is done is read from this copy's classes, not from a
// process-wide flag (a copy loaded second would otherwise have no associations or model hooks).
if (!Object.hasOwn(User.associations, "patient")) {
  // A bulk update or destroy without a where clause would touch every row: refuse it.
  const guard = (options: { where?: unknown }) => {
    const where = options.where as Record<string | symbol, unknown> | undefined;
    if (!where || (Object.keys(where).length === 0 && Object.getOwnPropertySymbols(where).length === 0)) {
      throw new Error("Refusing a bulk update or destroy without a where clause.");
    }
  };
  sequelize.addHook("beforeBulkUpdate", guard);
  sequelize.addHook("beforeBulkDestroy", guard);

  User.belongsTo(Clinic, { foreignKey: "clinicId" });
  Patient.belongsTo(User, { foreignKey: "userId", as: "user" });
  Patient.belongsTo(Clinic, { foreignKey: "clinicId" });
  User.hasOne(Patient, { foreignKey: "userId", as: "patient" });

  Material.hasMany(MaterialMode, { foreignKey: "materialId", as: "modes" });
  MaterialMode.belongsTo(Material, { foreignKey: "materialId" });

  Proposal.hasMany(ProposalMaterial, { foreignKey: "proposalId", as: "options" });
  ProposalMaterial.belongsTo(Material, { foreignKey: "materialId", as: "material" });
  Proposal.belongsTo(Patient, { foreignKey: "patientId", as: "patient" });
  Proposal.belongsTo(User, { foreignKey: "dentistId", as: "dentist" });

  Appointment.belongsTo(Proposal, { foreignKey: "proposalId", as: "proposal" });
  Appointment.belongsTo(Patient, { foreignKey: "patientId", as: "patient" });
  Appointment.belongsTo(Material, { foreignKey: "materialId", as: "material" });
  Appointment.belongsTo(User, { foreignKey: "dentistId", as: "dentist" });
  Appointment.hasMany(AppointmentStage, { foreignKey: "appointmentId", as: "stages" });
  Appointment.hasMany(Reservation, { foreignKey: "appointmentId", as: "reservations" });
  Proposal.hasMany(Appointment, { foreignKey: "proposalId", as: "appointments" });

  Equipment.hasMany(EquipmentOutage, { foreignKey: "equipmentId", as: "outages" });
  EquipmentOutage.belongsTo(Equipment, { foreignKey: "equipmentId", as: "equipment" });
  Appointment.hasMany(BlockLot, { foreignKey: "appointmentId", as: "lots" });
  BlockLot.belongsTo(Appointment, { foreignKey: "appointmentId", as: "appointment" });

  PatientDocument.belongsTo(Patient, { foreignKey: "patientId", as: "patient" });
  PatientDocument.belongsTo(User, { foreignKey: "uploadedById", as: "uploadedBy" });
  Patient.hasMany(PatientDocument, { foreignKey: "patientId", as: "documents" });

  Consent.belongsTo(Appointment, { foreignKey: "appointmentId", as: "appointment" });
  Consent.belongsTo(ConsentTemplate, { foreignKey: "templateId", as: "template" });
  Consent.hasMany(ConsentPdf, { foreignKey: "consentId", as: "pdfs" });
  Appointment.hasMany(Consent, { foreignKey: "appointmentId", as: "consents" });
  registerConsentGuard();
}

export {
  sequelize, Appointment, AppointmentStage, AuditEvent, BlockLot, Clinic, ClosedDay, Consent, ConsentPdf, ConsentTemplate, Equipment, EquipmentOutage,
  Material, MaterialMode, OpeningHour, Patient, PatientDocument, Proposal, ProposalMaterial, Reservation, SignInAttempt,
  StageDuration, User, MailOutbox, MailAttempt, FurnaceProgramme,
};
