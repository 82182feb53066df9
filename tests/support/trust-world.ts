// Two clinics with their staff and patients, and fresh rows on demand, for the tests that walk
// every API route as every kind of caller (access matrix, malformed-input fuzz).
import { randomUUID } from "node:crypto";
import sharp from "sharp";
import { NextRequest } from "next/server";
import { QueryTypes } from "sequelize";
import { Appointment, EquipmentOutage, sequelize, type User } from "@/db/models";
import { openConsentForPatient, signConsent } from "@/lib/data/consents";
import { createDocument } from "@/lib/data/documents";
import { QUESTION_KEYS } from "@/lib/domain/consent-questionnaire";
import { SECTION_KEYS } from "@/lib/domain/consent-text";
import { reminderToken } from "@/lib/mail/reminder-token";
import { createTestClinic, createTestPatient, createTestProposal, createUser, type TestClinic } from "./fixtures";
import { sessionOf, signInAs, signOut } from "./session";
import { pdfDocument } from "./sample-files";

export const ACTORS = ["anonymous", "owner", "otherPatient", "reception", "dentist", "admin", "foreignStaff"] as const;
export type Actor = (typeof ACTORS)[number];


export type World = Awaited<ReturnType<typeof createWorld>>;

const DAY = 24 * 3600 * 1000;

export async function createWorld() {
  const home: TestClinic = await createTestClinic();
  const away: TestClinic = await createTestClinic();
  const owner = await createTestPatient(home.clinic.id, "Owner Patient");
  const other = await createTestPatient(home.clinic.id, "Other Patient");
  // A patient of the other clinic, so its staff are not an empty clinic.
  await createTestPatient(away.clinic.id, "Away Patient");
  const proposal = await createTestProposal(home, owner.patient.id, { tooth: 36 });

  const users: Record<Exclude<Actor, "anonymous">, User> = {
    owner: owner.user,
    otherPatient: other.user,
    reception: home.staff.reception,
    dentist: home.staff.dentist,
    admin: home.staff.admin,
    foreignStaff: away.staff.reception,
  };
  let visitDay = 3;

  /** A fresh visit of the owner (on a fresh proposal: one active visit per proposal), some days ahead. */
  async function visit(status: Appointment["status"] = "requested") {
    const forVisit = await createTestProposal(home, owner.patient.id, { tooth: 36 });
    const chair = home.equipment.find((e) => e.kind === "chair")!;
    const mill = home.equipment.find((e) => e.kind === "mill")!;
    const startsAt = new Date(Date.now() + visitDay++ * DAY);
    return Appointment.create({
      clinicId: home.clinic.id, proposalId: forVisit.id, patientId: owner.patient.id, dentistId: home.staff.dentist.id,
      materialId: home.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status, startsAt,
      endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: chair.id, millId: mill.id, furnaceId: null, feeCents: 145000, createdBy: null,
    });
  }

  /** A fresh signed consent of the owner (on a fresh confirmed visit). */
  async function consent(): Promise<string> {
    const v = await visit("confirmed");
    const user = sessionOf(owner.user);
    const view = await openConsentForPatient({ user, appointmentId: v.id, ip: "203.0.113.9", userAgent: "RouteMatrix/1.0" });
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="200"><path d="M30 150 C 90 20, 130 20, 170 140 S 270 60, 310 120" stroke="#1f2a37" stroke-width="5" fill="none"/></svg>`;
    const signature = `data:image/png;base64,${(await sharp(Buffer.from(svg)).png().toBuffer()).toString("base64")}`;
    const signed = await signConsent({
      user,
      input: {
        appointmentId: v.id, templateId: view!.form!.templateId, textSha256: view!.form!.textSha256,
        answers: { ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">), otherAllergies: "", medicines: "", notes: "" },
        acknowledged: [...SECTION_KEYS], electronicRecords: true, typedName: "Owner Patient", signature,
      },
      ip: "203.0.113.9", userAgent: "RouteMatrix/1.0",
    });
    return signed.consentId;
  }

  let documentId: string | undefined;
  /** The owner's document (one, shared: reading it changes nothing but its audit trail). */
  async function document(): Promise<string> {
    documentId ??= (await createDocument({
      actor: sessionOf(owner.user), kind: "other", title: "Matrix letter",
      file: { name: "letter.pdf", bytes: pdfDocument("matrix") }, client: { ip: "203.0.113.9", userAgent: "RouteMatrix/1.0" },
    })).id;
    return documentId;
  }

  /** A fresh out-of-service range of the home clinic's first chair, starting tomorrow. */
  async function outage(): Promise<string> {
    const chair = home.equipment.find((e) => e.kind === "chair")!;
    const start = new Date(Date.now() + DAY);
    const row = await EquipmentOutage.create({ equipmentId: chair.id, during: [start, new Date(start.getTime() + 3600_000)], reason: null, createdBy: home.staff.admin.id });
    return String(row.id);
  }

  /** A fresh patient of the home clinic (invitations are throttled per patient, so each call gets its own). */
  async function patient(): Promise<string> {
    return (await createTestPatient(home.clinic.id, "Matrix Patient")).patient.id;
  }

  /** A fresh reception account of the home clinic, for the manager to change. */
  async function staffMember(): Promise<string> {
    return (await createUser(home.clinic.id, "reception", "Matrix Reception")).id;
  }

  // Payments: a deposit row on a fresh confirmed visit of the owner, as booking asks it (due) or as
  // the payment service's webhook leaves it (paid), so deposit and receipt routes have something to act on.
  async function depositVisit(status: "due" | "paid"): Promise<string> {
    const v = await visit("confirmed");
    await sequelize.query(
      `INSERT INTO deposits (clinic_id, appointment_id, amount_cents, currency, status, payment_intent_id, paid_at)
       VALUES ($1, $2, 20000, $3, $4, $5, $6)`,
      { bind: [home.clinic.id, v.id, home.clinic.currency, status, status === "paid" ? `pi_world_${v.id}` : null, status === "paid" ? new Date() : null] },
    );
    return v.id;
  }

  return { home, away, owner, other, proposal, users, make: { visit, consent, document, outage, patient, staffMember, token: async () => {
    const v = await visit("confirmed");
    return reminderToken(v.id, v.startsAt);
  } },
  // Payments
  money: { dueDepositVisit: () => depositVisit("due"), paidDepositVisit: () => depositVisit("paid") } };
}

export function actAs(world: World, actor: Actor) {
  if (actor === "anonymous") signOut();
  else signInAs(world.users[actor]);
}

/** A request as our own pages send it: same origin, JSON unless a form is given. */
export function apiRequest(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): NextRequest {
  const init: { method: string; headers: Record<string, string>; body?: BodyInit } = {
    method,
    headers: { origin: "http://localhost", "x-forwarded-for": "203.0.113.9", "user-agent": "RouteMatrix/1.0", ...headers },
  };
  if (body instanceof FormData) init.body = body;
  else if (typeof body === "string") {
    init.body = body;
    init.headers["content-type"] ??= "application/json";
  } else if (body !== undefined) {
    init.body = JSON.stringify(body);
    init.headers["content-type"] ??= "application/json";
  }
  return new NextRequest(`http://localhost${path}`, init);
}

/**
 * Audit events that record a read, not a change: reading personal data is logged on every
 * successful read, and some routes take no input at all, so any request to them is well formed
 * (GET /api/me/export by a patient exports, whatever junk the query holds). They are left out of
 * the snapshot; the audit events of every change stay in it.
 */
export const READ_AUDIT_ACTIONS = ["documents.listed", "document.viewed", "document.downloaded", "patient.records_exported"];

/** Row counts and a checksum of the main tables, limited to the world's two clinics. */
export async function snapshot(world: World): Promise<Record<string, string>> {
  const clinics = [world.home.clinic.id, world.away.clinic.id];
  const reads = READ_AUDIT_ACTIONS;
  const tables: Record<string, string> = {
    appointments: "SELECT t.* FROM appointments t WHERE t.clinic_id IN (:clinics)",
    proposals: "SELECT t.* FROM proposals t WHERE t.clinic_id IN (:clinics)",
    proposal_materials: "SELECT t.* FROM proposal_materials t JOIN proposals p ON p.id = t.proposal_id WHERE p.clinic_id IN (:clinics)",
    consents: "SELECT t.* FROM consents t JOIN appointments a ON a.id = t.appointment_id WHERE a.clinic_id IN (:clinics)",
    documents: "SELECT t.* FROM documents t WHERE t.clinic_id IN (:clinics)",
    equipment: "SELECT t.* FROM equipment t WHERE t.clinic_id IN (:clinics)",
    equipment_outages: "SELECT t.* FROM equipment_outages t JOIN equipment e ON e.id = t.equipment_id WHERE e.clinic_id IN (:clinics)",
    users: "SELECT t.id, t.email, t.role, t.active, t.clinic_id FROM users t WHERE t.clinic_id IN (:clinics)",
    patients: "SELECT t.* FROM patients t WHERE t.clinic_id IN (:clinics)",
    patient_invitations: "SELECT t.* FROM patient_invitations t WHERE t.clinic_id IN (:clinics)",
    email_changes: "SELECT t.* FROM email_changes t JOIN patients p ON p.id = t.patient_id WHERE p.clinic_id IN (:clinics)",
    audit_events: "SELECT t.* FROM audit_events t WHERE t.clinic_id IN (:clinics) AND t.action NOT IN (:reads)",
    // Payments
    deposits: "SELECT t.* FROM deposits t WHERE t.clinic_id IN (:clinics)",
    desk_payments: "SELECT t.* FROM desk_payments t WHERE t.clinic_id IN (:clinics)",
    plan_estimates: "SELECT t.* FROM plan_estimates t JOIN proposals p ON p.id = t.proposal_id WHERE p.clinic_id IN (:clinics)",
  };
  const out: Record<string, string> = {};
  for (const [name, sql] of Object.entries(tables)) {
    const [row] = await sequelize.query<{ n: string; sum: string | null }>(
      `SELECT count(*)::text AS n, md5(coalesce(string_agg(x::text, '|' ORDER BY x::text), '')) AS sum FROM (${sql}) x`,
      { replacements: { clinics, reads }, type: QueryTypes.SELECT },
    );
    out[name] = `${row.n}:${row.sum}`;
  }
  return out;
}

export const newId = () => randomUUID();
