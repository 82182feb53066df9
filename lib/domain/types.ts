// Words of the domain shared by lib/, db/ and the UI (see DESIGN.md).

export const MODES = ["rapid", "standard", "refined"] as const;
export type Mode = (typeof MODES)[number];

export const TOOTH_CLASSES = ["anterior", "premolar", "molar"] as const;
export type ToothClass = (typeof TOOTH_CLASSES)[number];

export type Cementation = "adhesive" | "conventional";
export type Fabrication = "dry_milling" | "wet_grinding";
export type HeatTreatment = "sintering" | "crystallisation" | "none";
export type FinishingKind = "polish" | "stain_glaze";

export const RESOURCE_KINDS = ["chair", "dentist", "mill", "furnace"] as const;
export type ResourceKind = (typeof RESOURCE_KINDS)[number];

export const APPOINTMENT_STATUSES = [
  "requested", "confirmed", "checked_in", "in_progress", "completed", "declined", "cancelled", "no_show",
] as const;
export type AppointmentStatus = (typeof APPOINTMENT_STATUSES)[number];

/** Visits in these states hold their reservations. */
export const ACTIVE_STATUSES: readonly AppointmentStatus[] = ["requested", "confirmed", "checked_in", "in_progress"];

export const STAGE_KEYS = [
  "check_in", "anaesthesia", "preparation", "scan", "design", "fabrication",
  "heat_treatment", "finishing", "glaze_firing", "try_in", "cementation", "aftercare",
] as const;
export type StageKey = (typeof STAGE_KEYS)[number];

export const ROLES = ["patient", "reception", "dentist", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const CONSENT_STATUSES = ["pending", "signed", "reviewed", "withdrawn"] as const;
export type ConsentStatus = (typeof CONSENT_STATUSES)[number];
