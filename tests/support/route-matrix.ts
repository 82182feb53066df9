// Who may call what: one row for every method of every route under app/api, with the status each
// kind of caller gets. tests/integration/route-matrix.test.ts walks it against the route handlers;
// it fails when a route file exports a method without a row here.
//
// Adding a route: add one row per exported method.
//   route   the file's folder under app/, e.g. "/api/appointments/[id]/cancel"
//   params  what fills each [segment]: "visit" | "consent" | "document" | "outage" | "proposal" |
//           "token" | "ownerPatient" (the owner's patient row) | "patient" (a fresh patient of the
//           home clinic) | "staffMember" (a fresh reception account of the home clinic) | a literal
//           string (a stage key, say). Rows are made fresh for every call.
//   query   the query string, may use the fillers {ownerPatient} and {zirconia}: "?patientId={ownerPatient}"
//   body    a JSON value, or a function of the world and the filled ids, or { form: … } for multipart
//   expect  seven statuses in this order:
//           anonymous  owner  otherPatient  reception  dentist  admin  foreignStaff
//           "owner" is the patient whose row it is; "foreignStaff" is reception of another clinic.
//           Or "skip: why" for routes that are not ours to walk.
import { randomUUID } from "node:crypto";
import type { World } from "./trust-world";
import { pdfDocument } from "./sample-files";

export type Fill =
  | "visit" | "requestedVisit" | "consent" | "document" | "outage" | "proposal" | "token"
  | "ownerPatient" | "patient" | "staffMember" | { literal: string }
  // Payments: a confirmed visit of the owner with a deposit due, or one paid through the payment service.
  | "dueDepositVisit" | "paidDepositVisit";
export type Ids = Record<string, string>;
export type Body = ((world: World, ids: Ids) => unknown) | { form: (world: World, ids: Ids) => FormData } | Record<string, unknown>;

export type MatrixRow = {
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  route: string;
  params?: Record<string, Fill>;
  query?: string;
  body?: Body;
  expect: string;
};

const DAY = 24 * 3600 * 1000;
/** A clinic-local wall-clock time N days ahead (the form's datetime-local shape). */
const localIn = (days: number, time: string) => `${new Date(Date.now() + days * DAY).toISOString().slice(0, 10)}T${time}`;
let registered = 0;
/** A new person on every call, so registering twice is never the same person (409). */
const newPerson = () => {
  registered += 1;
  return { name: `Matrix Registrant ${registered}`, email: `matrix-${randomUUID()}@cuspal.test`, dateOfBirth: "1984-06-12" };
};

export const ROUTE_MATRIX: MatrixRow[] = [
  // ——— visits ———
  { method: "GET", route: "/api/appointments", expect: "401 403 403 200 200 200 200" },
  {
    method: "POST", route: "/api/appointments",
    // A start in the past is refused after the access check, so the walk books nothing.
    body: (w) => ({ proposalId: w.proposal.id, materialId: w.home.materialByKey["zirconia"].id, mode: "standard", start: "2020-03-16T09:00:00-04:00" }),
    expect: "401 400 404 400 403 400 404",
  },
  { method: "GET", route: "/api/appointments/[id]/availability", params: { id: "requestedVisit" }, expect: "401 200 404 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/cancel", params: { id: "requestedVisit" }, body: { reason: "Travelling that week" }, expect: "401 200 404 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/confirm", params: { id: "requestedVisit" }, expect: "401 403 403 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/decline", params: { id: "requestedVisit" }, body: { reason: "The mill is serviced that day" }, expect: "401 403 403 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/lot", params: { id: "visit" }, body: { lot: "LOT2027A" }, expect: "401 403 403 200 200 403 404" },
  // A start in the past: refused (400) once access is granted, so nothing moves.
  { method: "POST", route: "/api/appointments/[id]/move", params: { id: "requestedVisit" }, body: { start: "2020-03-16T09:00:00-04:00" }, expect: "401 400 404 400 403 400 404" },
  { method: "GET", route: "/api/appointments/[id]/stages", params: { id: "visit" }, expect: "401 403 403 200 200 200 404" },
  // The walk's visits are days ahead, so starting a stage now is refused by the visit-day rule (422) once access is granted.
  { method: "POST", route: "/api/appointments/[id]/stages/[key]", params: { id: "visit", key: { literal: "check_in" } }, body: { action: "start" }, expect: "401 403 403 422 422 403 404" },
  { method: "GET", route: "/api/appointments/[id]/timeline", params: { id: "visit" }, expect: "401 200 404 200 200 200 404" },

  // ——— sign-in (next-auth checks its own CSRF token and answers in its own format) ———
  { method: "GET", route: "/api/auth/[...nextauth]", expect: "skip: next-auth's own route" },
  { method: "POST", route: "/api/auth/[...nextauth]", expect: "skip: next-auth's own route" },

  // ——— day board ———
  { method: "GET", route: "/api/board", expect: "401 403 403 200 200 200 200" },
  { method: "GET", route: "/api/board/outages", expect: "401 403 403 200 200 200 200" },
  {
    method: "POST", route: "/api/board/outages",
    body: (w) => ({ equipmentId: w.home.equipment.find((e) => e.kind === "furnace")!.id, start: localIn(40, "07:00"), end: localIn(40, "07:30") }),
    expect: "401 403 403 201 201 201 404",
  },
  { method: "DELETE", route: "/api/board/outages/[id]", params: { id: "outage" }, expect: "401 403 403 200 200 200 404" },

  // ——— consent ———
  { method: "GET", route: "/api/consents", expect: "401 403 403 200 200 200 200" },
  // An empty form is refused after the role check: nothing is signed by the walk.
  { method: "POST", route: "/api/consents", body: {}, expect: "401 400 400 403 403 403 403" },
  { method: "GET", route: "/api/consents/[id]/pdf", params: { id: "consent" }, expect: "401 200 404 200 200 200 404" },
  { method: "POST", route: "/api/consents/[id]/review", params: { id: "consent" }, expect: "401 403 403 403 200 403 403" },
  { method: "POST", route: "/api/consents/[id]/withdraw", params: { id: "consent" }, body: { reason: "Changed my mind" }, expect: "401 200 404 200 200 200 404" },
  {
    method: "POST", route: "/api/consents/verify",
    body: { form: () => fileForm({}, pdfDocument("not a consent"), "check.pdf", "application/pdf") },
    expect: "401 403 403 200 200 200 200",
  },

  // ——— documents ———
  { method: "GET", route: "/api/documents", query: "?patientId={ownerPatient}", expect: "401 200 404 200 200 200 404" },
  {
    method: "POST", route: "/api/documents",
    body: { form: (w: World) => fileForm({ kind: "other", title: "Matrix upload", patientId: w.owner.patient.id }, pdfDocument("upload"), "upload.pdf", "application/pdf") },
    expect: "401 201 404 201 201 201 404",
  },
  { method: "GET", route: "/api/documents/[id]", params: { id: "document" }, expect: "401 200 404 200 200 200 404" },

  // ——— health, catalogue, staff ———
  { method: "GET", route: "/api/health", expect: "200 200 200 200 200 200 200" },
  { method: "GET", route: "/api/health/live", expect: "200 200 200 200 200 200 200" },
  { method: "GET", route: "/api/materials", expect: "401 200 200 200 200 200 200" },
  { method: "GET", route: "/api/openapi.json", expect: "200 200 200 200 200 200 200" },
  { method: "GET", route: "/api/staff", expect: "401 403 403 200 200 200 200" },
  // Only the clinic manager changes staff accounts; another clinic's manager gets 404 (tested beside the walk).
  { method: "PATCH", route: "/api/staff/[id]", params: { id: "staffMember" }, body: { role: "dentist" }, expect: "401 403 403 403 403 200 403" },

  // ——— patient records (staff) ———
  { method: "GET", route: "/api/patients", query: "?q=Owner", expect: "401 403 403 200 200 200 200" },
  // Another clinic's staff register the person in their own clinic: that is allowed (201).
  { method: "POST", route: "/api/patients", body: () => newPerson(), expect: "401 403 403 201 201 201 201" },
  { method: "GET", route: "/api/patients/[id]", params: { id: "ownerPatient" }, expect: "401 403 403 200 200 200 404" },
  { method: "PATCH", route: "/api/patients/[id]", params: { id: "ownerPatient" }, body: { reminders: true }, expect: "401 403 403 200 200 200 404" },
  { method: "POST", route: "/api/patients/[id]/invite", params: { id: "patient" }, expect: "401 403 403 202 202 202 404" },

  // ——— the signed-in patient's own profile ———
  { method: "GET", route: "/api/me", expect: "401 200 200 403 403 403 403" },
  { method: "PATCH", route: "/api/me", body: { reminders: true }, expect: "401 200 200 403 403 403 403" },
  { method: "GET", route: "/api/me/export", expect: "401 200 200 403 403 403 403" },
  // The e-mailed link is the authority, not the session: an unknown link sends anyone to the profile page.
  { method: "GET", route: "/api/me/email", query: `?token=${"0".repeat(64)}`, expect: "303 303 303 303 303 303 303" },

  // ——— proposals ———
  { method: "GET", route: "/api/proposals", expect: "401 200 200 200 200 200 200" },
  {
    method: "POST", route: "/api/proposals",
    body: (w) => ({ patientId: w.owner.patient.id, dentistId: w.home.staff.dentist.id, tooth: 46, fee: 1200, options: [{ materialId: w.home.materialByKey["zirconia"].id, modes: ["standard"] }] }),
    expect: "401 403 403 403 201 201 403",
  },
  {
    method: "GET", route: "/api/proposals/[id]/availability", params: { id: "proposal" },
    query: "?materialId={zirconia}&mode=standard&days=3",
    expect: "401 200 404 200 200 200 404",
  },

  // ——— reminders by e-mail link (the signed token is the authority, not the session) ———
  { method: "GET", route: "/api/reminders/[token]", params: { token: "token" }, expect: "303 303 303 303 303 303 303" },
  { method: "POST", route: "/api/reminders/[token]", params: { token: "token" }, body: { enabled: false }, expect: "200 200 200 200 200 200 200" },

  // Payments
  { method: "GET", route: "/api/appointments/[id]", params: { id: "visit" }, expect: "401 200 404 200 200 200 404" },
  // Each allowed caller opens a real checkout on the local payment fake for a fresh due deposit.
  { method: "POST", route: "/api/appointments/[id]/deposit", params: { id: "dueDepositVisit" }, expect: "401 200 404 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/deposit/waive", params: { id: "dueDepositVisit" }, body: { reason: "Agreed with the clinic manager" }, expect: "401 403 403 200 403 200 404" },
  { method: "POST", route: "/api/appointments/[id]/desk-payments", params: { id: "visit" }, body: { method: "cash", amount: "50.00" }, expect: "401 403 403 201 403 201 404" },
  { method: "GET", route: "/api/appointments/[id]/receipt", params: { id: "paidDepositVisit" }, expect: "401 200 404 200 200 200 404" },
  // No Stripe-Signature header: the signature, not the session, decides, so every caller gets 400.
  // Signed events are walked in tests/integration/payments.test.ts.
  { method: "POST", route: "/api/payments/webhook", body: { id: "evt_matrix", object: "event", type: "checkout.session.completed" }, expect: "400 400 400 400 400 400 400" },
  { method: "GET", route: "/api/payments", query: "?format=csv&from=2020-01-01", expect: "401 403 403 200 200 200 200" },
  {
    method: "PUT", route: "/api/proposals/[id]/plan-estimate", params: { id: "proposal" },
    body: { coveragePercent: 50, deductibleRemaining: "50", annualMaxRemaining: "1500" },
    expect: "401 200 404 200 200 200 404",
  },
];

function fileForm(fields: Record<string, string>, bytes: Uint8Array, name: string, type: string): FormData {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set("file", new File([Buffer.from(bytes)], name, { type }));
  return form;
}

/** The row's query string with its fillers replaced by the world's rows. */
export function rowQuery(row: MatrixRow, w: World): string {
  return (row.query ?? "").replace("{ownerPatient}", w.owner.patient.id).replace("{zirconia}", w.home.materialByKey["zirconia"].id);
}

/** The row's body: a JSON value, or a FormData for multipart rows. */
export function rowBody(row: MatrixRow, w: World, ids: Ids): unknown {
  const body = typeof row.body === "function" ? row.body(w, ids) : row.body;
  return body && typeof body === "object" && "form" in body && typeof body.form === "function" ? body.form(w, ids) : body;
}

export function rowKey(method: string, route: string): string {
  return `${method} ${route}`;
}
