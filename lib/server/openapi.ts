// The published v1 API: an OpenAPI 3.1 document built from the zod schemas the route handlers
// parse with, so the document cannot drift from what the server accepts. Served at /api/openapi.json.
import "server-only";
import { z, type ZodType } from "zod";
import { availabilityQuerySchema, bookingSchema, cancelSchema, declineSchema, moveSchema, proposalSchema } from "@/lib/booking/schemas";
import { lotBodySchema } from "@/lib/data/lots";
import { stageMarkSchema } from "@/lib/data/progress";
import { signConsentSchema, withdrawConsentSchema } from "@/lib/domain/consent-schemas";
import { outageSchema } from "@/lib/domain/outage-schema";
import { DEFAULT_COUNTRY, registerPatientSchema, updateMeSchema, updatePatientSchema } from "@/lib/domain/patient-record";
import { staffAccessSchema } from "@/lib/domain/settings-schemas";
import { documentFieldsSchema } from "@/lib/documents/schema";
import { JSON_BODY_LIMIT } from "./api";
import {
  appointmentListQuery, boardQuery, consentListQuery, consentPdfQuery, documentListQuery, documentOpenQuery,
  fileUploadBody, reminderFormBody, reminderJsonBody, visitAvailabilityQuery,
} from "./route-schemas";
// Payments
import { deskPaymentSchema, paymentsQuerySchema, planEstimateSchema, waiveSchema } from "@/lib/domain/payment-schemas";

type Who = "anyone" | "signed-in" | "token" | readonly ("patient" | "reception" | "dentist" | "admin")[];

export type ApiOperation = {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** OpenAPI path template: `/api/appointments/{id}/cancel`. */
  path: string;
  summary: string;
  who: Who;
  query?: ZodType;
  json?: ZodType;
  multipart?: ZodType;
  form?: ZodType;
  /** The success status and what it holds. */
  ok: { status: number; description: string; type?: string };
  /** Body cap when it differs from the JSON default. */
  maxBytes?: number;
  /** Answers beyond the common 4xx list (a 502 when the payment service is down). */
  moreErrors?: Record<string, string>;
};

const STAFF = ["reception", "dentist", "admin"] as const;
const json = { type: "application/json" };
// The patient schemas depend on the clinic's country (phone numbers) and today's date (dates of
// birth); the document shows them for the default country, the fields are the same everywhere.
const patientContext = { country: DEFAULT_COUNTRY, today: new Date().toISOString().slice(0, 10) };

/** Every operation of the API; a test checks each route file's methods have one. */
export const API_OPERATIONS: ApiOperation[] = [
  { method: "get", path: "/api/appointments", summary: "The clinic's visits, optionally by status", who: STAFF, query: appointmentListQuery, ok: { status: 200, description: "The visits", ...json } },
  { method: "post", path: "/api/appointments", summary: "Book a visit for a proposal", who: ["patient", "reception", "admin"], json: bookingSchema, ok: { status: 201, description: "The visit was requested", ...json } },
  { method: "get", path: "/api/appointments/{id}/availability", summary: "Free start times to move a visit to", who: ["patient", "reception", "admin"], query: visitAvailabilityQuery, ok: { status: 200, description: "Start times in the clinic's time zone", ...json } },
  { method: "post", path: "/api/appointments/{id}/cancel", summary: "Cancel a visit", who: ["patient", "reception", "admin"], json: cancelSchema, ok: { status: 200, description: "The visit's new status", ...json } },
  { method: "post", path: "/api/appointments/{id}/confirm", summary: "Confirm a requested visit", who: ["reception", "admin"], ok: { status: 200, description: "The visit's new status", ...json } },
  { method: "post", path: "/api/appointments/{id}/decline", summary: "Decline a requested visit, with a reason for the patient", who: ["reception", "admin"], json: declineSchema, ok: { status: 200, description: "The visit's new status", ...json } },
  { method: "post", path: "/api/appointments/{id}/lot", summary: "Record the crown block used (GS1 element string or typed lot)", who: ["dentist", "reception"], json: lotBodySchema, ok: { status: 200, description: "The recorded block", ...json } },
  { method: "post", path: "/api/appointments/{id}/move", summary: "Move a visit to another free start", who: ["patient", "reception", "admin"], json: moveSchema, ok: { status: 200, description: "The visit's new start", ...json } },
  { method: "get", path: "/api/appointments/{id}/stages", summary: "A visit's stages as planned, recorded and projected", who: STAFF, ok: { status: 200, description: "The stages", ...json } },
  { method: "post", path: "/api/appointments/{id}/stages/{key}", summary: "Mark a stage started or finished", who: ["dentist", "reception"], json: stageMarkSchema, ok: { status: 200, description: "The stages after the mark", ...json } },
  { method: "get", path: "/api/appointments/{id}/timeline", summary: "A visit's timeline", who: "signed-in", ok: { status: 200, description: "The timeline", ...json } },
  { method: "get", path: "/api/auth/{nextauth}", summary: "Sign-in (next-auth's own routes: session, CSRF token, providers)", who: "anyone", ok: { status: 200, description: "next-auth's answer" } },
  { method: "post", path: "/api/auth/{nextauth}", summary: "Sign-in and sign-out (next-auth's own routes; they check their CSRF token)", who: "anyone", ok: { status: 302, description: "next-auth's redirect" } },
  { method: "get", path: "/api/board", summary: "The day board for one clinic-local day", who: STAFF, query: boardQuery, ok: { status: 200, description: "The board", ...json } },
  { method: "get", path: "/api/board/outages", summary: "Current and coming out-of-service ranges", who: STAFF, ok: { status: 200, description: "The ranges and the visits they touch", ...json } },
  { method: "post", path: "/api/board/outages", summary: "Mark a chair, mill or furnace out of service", who: STAFF, json: outageSchema, ok: { status: 201, description: "The range and the visits it touches", ...json } },
  { method: "delete", path: "/api/board/outages/{id}", summary: "Back in service", who: STAFF, ok: { status: 200, description: "Ended", ...json } },
  { method: "get", path: "/api/consents", summary: "The clinic's consents a page at a time (limit 1–100, default 50), newest first, optionally by status; pass nextCursor back as cursor for the next page", who: STAFF, query: consentListQuery, ok: { status: 200, description: "A page of consents and the cursor of the next one (null on the last page)", ...json } },
  { method: "post", path: "/api/consents", summary: "The patient signs their visit's consent", who: ["patient"], json: signConsentSchema, maxBytes: 400_000, ok: { status: 201, description: "Signed", ...json } },
  { method: "get", path: "/api/consents/{id}/pdf", summary: "The sealed consent PDF", who: ["patient", ...STAFF], query: consentPdfQuery, ok: { status: 200, description: "The PDF", type: "application/pdf" } },
  { method: "post", path: "/api/consents/{id}/review", summary: "The dentist marks a signed consent reviewed", who: ["dentist"], ok: { status: 200, description: "Reviewed", ...json } },
  { method: "post", path: "/api/consents/{id}/withdraw", summary: "Withdraw a signed consent before the visit", who: ["patient", ...STAFF], json: withdrawConsentSchema, ok: { status: 200, description: "Withdrawn", ...json } },
  { method: "post", path: "/api/consents/verify", summary: "Check whether a PDF is an unaltered consent of this clinic", who: STAFF, multipart: fileUploadBody, maxBytes: 20 * 1024 * 1024 + 64 * 1024, ok: { status: 200, description: "Whether it matches", ...json } },
  { method: "get", path: "/api/documents", summary: "The caller's documents, or one patient's (staff)", who: "signed-in", query: documentListQuery, ok: { status: 200, description: "The documents", ...json } },
  { method: "post", path: "/api/documents", summary: "Upload a document", who: "signed-in", multipart: documentFieldsSchema.extend(fileUploadBody.shape), ok: { status: 201, description: "Stored", ...json } },
  { method: "get", path: "/api/documents/{id}", summary: "A document's bytes (PDFs are always saved, images may be shown)", who: "signed-in", query: documentOpenQuery, ok: { status: 200, description: "The file", type: "application/octet-stream" } },
  { method: "get", path: "/api/health", summary: "Readiness: the app and its database answer", who: "anyone", ok: { status: 200, description: "Up", ...json } },
  { method: "get", path: "/api/health/live", summary: "Liveness: the app answers (no database)", who: "anyone", ok: { status: 200, description: "Alive", ...json } },
  { method: "get", path: "/api/materials", summary: "The clinic's active materials with cautions and modes", who: "signed-in", ok: { status: 200, description: "The materials", ...json } },
  { method: "get", path: "/api/openapi.json", summary: "This document", who: "anyone", ok: { status: 200, description: "OpenAPI 3.1", ...json } },
  { method: "get", path: "/api/proposals", summary: "The patient's proposals, or the clinic's (staff)", who: "signed-in", ok: { status: 200, description: "The proposals", ...json } },
  { method: "post", path: "/api/proposals", summary: "Propose a crown (the manager names the dentist)", who: ["dentist", "admin"], json: proposalSchema, ok: { status: 201, description: "Created", ...json } },
  { method: "get", path: "/api/proposals/{id}/availability", summary: "Free start times for a proposal's material and mode", who: ["patient", ...STAFF], query: availabilityQuerySchema, ok: { status: 200, description: "Start times in the clinic's time zone", ...json } },
  { method: "get", path: "/api/reminders/{token}", summary: "Send the reader of a reminder link to its page", who: "token", ok: { status: 303, description: "Redirect to the reminder page" } },
  { method: "post", path: "/api/reminders/{token}", summary: "Turn a visit's reminders off or on with the signed link (also RFC 8058 one-click)", who: "token", json: reminderJsonBody, form: reminderFormBody, ok: { status: 200, description: "The reminders' state (a form gets a 303 to the page)", ...json } },
  { method: "get", path: "/api/staff", summary: "The clinic's staff accounts", who: STAFF, ok: { status: 200, description: "The staff", ...json } },
  { method: "patch", path: "/api/staff/{id}", summary: "Turn a staff account on or off, or change its role (its sessions end)", who: ["admin"], json: staffAccessSchema, ok: { status: 200, description: "The account's role and state", ...json } },
  { method: "get", path: "/api/patients", summary: "Search the clinic's patients (query: q, page, archived, sort)", who: STAFF, ok: { status: 200, description: "One page of patients", ...json } },
  { method: "post", path: "/api/patients", summary: "Register a patient (409 with existingId when the same person is on file)", who: STAFF, json: registerPatientSchema(patientContext), ok: { status: 201, description: "Registered", ...json } },
  { method: "get", path: "/api/patients/{id}", summary: "One patient of the clinic", who: STAFF, ok: { status: 200, description: "The patient", ...json } },
  { method: "patch", path: "/api/patients/{id}", summary: "Correct a patient's details, archive or unarchive", who: STAFF, json: updatePatientSchema(patientContext), ok: { status: 200, description: "The patient after the change", ...json } },
  { method: "post", path: "/api/patients/{id}/invite", summary: "E-mail the patient a one-time sign-in link (429 past the hourly limit)", who: STAFF, ok: { status: 202, description: "Sent, with the link's expiry", ...json } },
  { method: "get", path: "/api/me", summary: "The signed-in patient's own profile", who: ["patient"], ok: { status: 200, description: "The profile", ...json } },
  { method: "patch", path: "/api/me", summary: "Change one's phone, language, reminders or e-mail (a new e-mail waits for its link)", who: ["patient"], json: updateMeSchema(DEFAULT_COUNTRY), ok: { status: 200, description: "The profile, and whether an e-mail change is pending", ...json } },
  { method: "get", path: "/api/me/export", summary: "The signed-in patient's records as a ZIP", who: ["patient"], ok: { status: 200, description: "The ZIP", type: "application/zip" } },
  { method: "get", path: "/api/me/email", summary: "Confirm a new e-mail address with the link sent to it (query: token)", who: "token", ok: { status: 303, description: "Redirect to the profile page with the outcome" } },

  // Payments
  { method: "get", path: "/api/appointments/{id}", summary: "One visit with its money: fee, plan estimate, deposit, balance", who: ["patient", ...STAFF], ok: { status: 200, description: "The visit", ...json } },
  {
    method: "post", path: "/api/appointments/{id}/deposit", summary: "Open the payment service's page for the visit's due deposit (the amount is the server's)", who: ["patient", "reception", "admin"],
    ok: { status: 200, description: "`{ checkoutUrl }`: send the payer there", ...json },
    moreErrors: { "502": "The payment service did not answer; nothing was charged" },
  },
  { method: "post", path: "/api/appointments/{id}/deposit/waive", summary: "Waive the visit's due deposit, with a reason", who: ["reception", "admin"], json: waiveSchema, ok: { status: 200, description: "The deposit, now waived", ...json } },
  { method: "post", path: "/api/appointments/{id}/desk-payments", summary: "Record money taken at the desk toward the visit's fee", who: ["reception", "admin"], json: deskPaymentSchema, ok: { status: 201, description: "The recorded payment", ...json } },
  { method: "get", path: "/api/appointments/{id}/receipt", summary: "The receipt of the visit's paid deposit", who: ["patient", ...STAFF], ok: { status: 200, description: "The receipt PDF (404 until the deposit is paid)", type: "application/pdf" } },
  { method: "get", path: "/api/payments", summary: "The clinic's deposits with totals, filtered by status and booking day", who: STAFF, query: paymentsQuerySchema, ok: { status: 200, description: "The deposits (`format=csv`: the same rows as text/csv)", ...json } },
  { method: "post", path: "/api/payments/webhook", summary: "The payment service's events; no session, the Stripe-Signature header over the raw body is checked (400 when it does not match)", who: "anyone", ok: { status: 200, description: "Received (a replayed event changes nothing)", ...json } },
  { method: "put", path: "/api/proposals/{id}/plan-estimate", summary: "Save the dental-plan figures of a proposal; the shares are computed by the server", who: ["patient", ...STAFF], json: planEstimateSchema, ok: { status: 200, description: "The saved figures", ...json } },
];

const ERRORS: Record<string, string> = {
  "400": "The input is not valid: `{ error, field? }` names the field",
  "401": "Not signed in",
  "403": "The role may not do this, or the request did not come from Cuspal's pages",
  "404": "No such record, or not the caller's (the same answer for both)",
  "409": "The record's state does not allow it (already done, taken, past a deadline)",
  "413": "The body is larger than the route accepts",
  "415": "The body is not of the content type the route reads",
  "422": "Understood but refused by a clinical or clinic rule",
};

const schemaOf = (s: ZodType) => z.toJSONSchema(s, { target: "draft-2020-12", io: "input", unrepresentable: "any" }) as Record<string, unknown>;

function whoText(who: Who): string {
  if (who === "anyone") return "Anyone.";
  if (who === "signed-in") return "Any signed-in user; rows are limited to the caller's own (patient) or clinic (staff).";
  if (who === "token") return "Anyone holding the link from one of our e-mails (a reminder, an address confirmation): the link's token authorises it.";
  return `Signed in as: ${who.join(", ")}.`;
}

export function buildOpenApi(baseUrl?: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of API_OPERATIONS) {
    const pathParams = [...op.path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
    const parameters: unknown[] = pathParams.map((name) => ({
      name, in: "path", required: true,
      schema: name === "id" && !op.path.startsWith("/api/board/outages") ? { type: "string", format: "uuid" } : { type: "string" },
    }));
    if (op.query) {
      const q = schemaOf(op.query) as { properties?: Record<string, unknown>; required?: string[] };
      for (const [name, schema] of Object.entries(q.properties ?? {})) parameters.push({ name, in: "query", required: q.required?.includes(name) ?? false, schema });
    }
    const content: Record<string, unknown> = {};
    if (op.json) content["application/json"] = { schema: schemaOf(op.json) };
    if (op.multipart) content["multipart/form-data"] = { schema: schemaOf(op.multipart) };
    if (op.form) content["application/x-www-form-urlencoded"] = { schema: schemaOf(op.form) };
    const mutating = op.method !== "get";
    const limit = op.maxBytes ?? JSON_BODY_LIMIT;
    const responses: Record<string, unknown> = {
      [String(op.ok.status)]: { description: op.ok.description, ...(op.ok.type ? { content: { [op.ok.type]: { schema: {} } } } : {}) },
    };
    for (const [code, description] of Object.entries({ ...ERRORS, ...op.moreErrors })) {
      if (!mutating && (code === "413" || code === "415")) continue;
      responses[code] = { description, content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } } };
    }
    paths[op.path] ??= {};
    paths[op.path][op.method] = {
      summary: op.summary,
      description: `${whoText(op.who)}${mutating && Object.keys(content).length ? ` Body at most ${Math.round(limit / 1024)} kB.` : ""}`,
      operationId: `${op.method}${op.path.replace(/[{}]/g, "").replace(/[^a-zA-Z0-9]+(.)?/g, (_, c: string | undefined) => (c ? c.toUpperCase() : ""))}`,
      ...(parameters.length ? { parameters } : {}),
      ...(Object.keys(content).length ? { requestBody: { required: (op.method === "post" || op.method === "put") && !!op.json && op.path !== "/api/consents/{id}/withdraw", content } } : {}),
      responses,
      ...(op.who === "anyone" || op.who === "token" ? { security: [] } : {}),
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Cuspal API",
      version: "1",
      description: "The JSON API behind Cuspal's pages. Errors are `{ error, field? }`; every answer is `Cache-Control: no-store`. See docs/api.md in the repository.",
    },
    ...(baseUrl ? { servers: [{ url: baseUrl }] } : {}),
    jsonSchemaDialect: "https://json-schema.org/draft/2020-12/schema",
    paths,
    components: {
      schemas: {
        Error: {
          type: "object",
          required: ["error"],
          properties: { error: { type: "string", description: "A sentence for a person" }, field: { type: "string", description: "The input field at fault, when there is one" } },
        },
      },
      securitySchemes: { session: { type: "apiKey", in: "cookie", name: "next-auth.session-token", description: "The session cookie set by signing in (`__Secure-` prefixed over https)." } },
    },
    security: [{ session: [] }],
  };
}
