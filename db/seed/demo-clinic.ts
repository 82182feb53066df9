// The invented demo clinic: Alder Bay Dental Studio in the invented harbour town of Alder Bay.
// All people are invented. Password for every demo account: cuspal-demo.
import type { Transaction } from "sequelize";
import {
  Clinic, ClosedDay, Equipment, Material, MaterialMode, OpeningHour, Patient, StageDuration, User,
} from "@/db/models";
import { hashPassword } from "@/lib/auth/password";
import { CATALOGUE, DEFAULT_STAGE_MINUTES } from "./catalogue";
import { CATALOGUE_FR } from "./catalogue-fr";

export const DEMO_PASSWORD = "cuspal-demo";

export const DEMO_PEOPLE = [
  { email: "patient@cuspal.test", name: "Zoë Halvorsen-Ruiz", role: "patient" },
  { email: "reception@cuspal.test", name: "Oskar Feldmann-Price", role: "reception" },
  { email: "dentist@cuspal.test", name: "Dr Amara Quist", role: "dentist" },
  { email: "admin@cuspal.test", name: "Lena Brightwater", role: "admin" },
] as const;

/** Other invented patients, so the clinic's day is not empty. */
// Phone numbers are in the 555-0100…0199 range North America keeps for fiction.
export const OTHER_PATIENTS = [
  { email: "tobias.renfrew@cuspal.test", name: "Tobias Renfrew", dateOfBirth: "1971-06-02", phone: "+16135550141", language: "en" },
  { email: "marisol.akande@cuspal.test", name: "Marisol Akande", dateOfBirth: "1988-11-19", phone: "+16135550152", language: "en" },
  { email: "henrik.oyelaran@cuspal.test", name: "Henrik Oyelaran", dateOfBirth: "1959-02-27", phone: "+16135550163", language: "en" },
  { email: "celeste.brisebois@cuspal.test", name: "Céleste Brisebois-Lafrenière", dateOfBirth: "1993-08-05", phone: "+18195550117", language: "fr" },
  { email: "noe.varennes@cuspal.test", name: "Noé Varennes", dateOfBirth: "2001-12-29", phone: "+16135550186", language: "fr" },
  { email: "ingrid.tamaro@cuspal.test", name: "Ingrid Tamaro", dateOfBirth: "1966-04-11", phone: null, language: "en" },
] as const;

/** Invented list prices of a crown per material, in cents (CAD). */
export const DEMO_LIST_PRICES: Record<string, number> = {
  zirconia: 145_000,
  "lithium-disilicate": 155_000,
  "leucite-glass-ceramic": 140_000,
  "feldspathic-ceramic": 135_000,
  "resin-ceramic-hybrid": 120_000,
  pmma: 35_000,
};

export async function seedClinic(transaction: Transaction) {
  const clinic = await Clinic.create(
    {
      name: "Alder Bay Dental Studio",
      slug: "alder-bay",
      timeZone: "America/Toronto",
      address: "14 Quayside Row, Alder Bay",
      phone: "+1 555 0134",
      currency: "CAD",
      // The demo accounts sign in with their password alone.
      requireTwoFactor: false,
      settings: { slotMinutes: 15, bufferMinutes: 10, minNoticeMinutes: 120, cancelCutoffHours: 24, reminderHoursBefore: [48, 2] },
      // A $200 deposit when a visit is booked, refundable until 48 hours before it.
      depositKind: "fixed",
      depositValue: 20_000,
      depositRefundHours: 48,
    },
    { transaction },
  );

  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const users: Record<string, User> = {};
  for (const person of DEMO_PEOPLE) {
    users[person.role] = await User.create(
      { email: person.email, name: person.name, role: person.role, clinicId: clinic.id, passwordHash, emailVerified: null },
      { transaction },
    );
  }
  // A second dentist (no demo sign-in needed) so two visits can run side by side on the board.
  users.dentist2 = await User.create(
    { email: "felix.amundsen@cuspal.test", name: "Dr Felix Amundsen", role: "dentist", clinicId: clinic.id, passwordHash, emailVerified: null },
    { transaction },
  );
  const patient = await Patient.create(
    { userId: users.patient.id, clinicId: clinic.id, dateOfBirth: "1984-03-17", phone: "+16135550178", language: "en", address: "12 Cedar Lane, Ottawa ON" },
    { transaction },
  );
  const others: Patient[] = [];
  for (const p of OTHER_PATIENTS) {
    const u = await User.create({ email: p.email, name: p.name, role: "patient", clinicId: clinic.id, passwordHash, emailVerified: null }, { transaction });
    others.push(await Patient.create({ userId: u.id, clinicId: clinic.id, dateOfBirth: p.dateOfBirth, phone: p.phone, language: p.language }, { transaction }));
  }

  // Monday–Friday with a lunch break, Saturday morning, Sunday closed.
  const hours = [1, 2, 3, 4, 5].flatMap((weekday) => [
    { clinicId: clinic.id, weekday, opens: "08:00", closes: "12:30" },
    { clinicId: clinic.id, weekday, opens: "13:30", closes: "18:00" },
  ]);
  hours.push({ clinicId: clinic.id, weekday: 6, opens: "09:00", closes: "13:00" });
  await OpeningHour.bulkCreate(hours, { transaction });
  await ClosedDay.bulkCreate([{ clinicId: clinic.id, day: "2026-12-25", reason: "Winter holiday" }, { clinicId: clinic.id, day: "2026-12-26", reason: "Winter holiday" }], { transaction });

  const equipment = await Equipment.bulkCreate(
    [
      { clinicId: clinic.id, kind: "chair", name: "Chair 1 — Harbour room" },
      { clinicId: clinic.id, kind: "chair", name: "Chair 2 — Lighthouse room" },
      { clinicId: clinic.id, kind: "chair", name: "Chair 3 — Dune room" },
      { clinicId: clinic.id, kind: "mill", name: "Mill A" },
      { clinicId: clinic.id, kind: "mill", name: "Mill B" },
      { clinicId: clinic.id, kind: "furnace", name: "Furnace 1" },
    ],
    { transaction, returning: true },
  );

  await seedCatalogue(clinic.id, transaction);
  for (const [key, cents] of Object.entries(DEMO_LIST_PRICES)) {
    await Material.update({ listFeeCents: cents }, { where: { clinicId: clinic.id, key }, transaction });
  }
  return { clinic, users, patient, others, equipment };
}

/** Copies the default catalogue and stage minutes into a clinic. */
export async function seedCatalogue(clinicId: string, transaction?: Transaction) {
  for (const [i, item] of CATALOGUE.entries()) {
    const { modes, ...fields } = item;
    const fr = CATALOGUE_FR[item.key];
    const material = await Material.create({ ...fields, clinicId, sortOrder: i, translations: fr ? { fr } : {} }, { transaction });
    await MaterialMode.bulkCreate(modes.map((m) => ({ ...m, materialId: material.id })), { transaction });
  }
  await StageDuration.bulkCreate(
    DEFAULT_STAGE_MINUTES.map((s) => ({ clinicId, stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes })),
    { transaction },
  );
}
