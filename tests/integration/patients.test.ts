// Patient records through the route handlers against PostgreSQL, the mail catcher and the S3 fake:
// registration and its refusals, search, access between clinics, invitations, archiving.
// The session is faked; everything else is real.
import { createRequire } from "node:module";
import path from "node:path";
import { NextRequest } from "next/server";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { AuditEvent, Patient, User, sequelize } from "@/db/models";
import { bookVisit } from "@/lib/booking/book";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { caughtFor, eventually } from "../support/mail";
import { sessionOf, signInAs, signOut } from "../support/session";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const patientsRoute = await import("@/app/api/patients/route");
const patientRoute = await import("@/app/api/patients/[id]/route");
const inviteRoute = await import("@/app/api/patients/[id]/invite/route");
const meRoute = await import("@/app/api/me/route");
const { authOptions } = await import("@/lib/auth/options");

const as = signInAs;

let t: TestClinic;
let other: TestClinic;

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
});

afterEach(() => {
  signOut();
});

const json = (method: string, url: string, body?: unknown) =>
  new NextRequest(`http://localhost${url}`, { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { "content-type": "application/json" } });
const params = (id: string) => ({ params: Promise.resolve({ id }) });

async function register(body: Record<string, unknown>) {
  const res = await patientsRoute.POST(json("POST", "/api/patients", body), undefined);
  return { status: res.status, body: await res.json() };
}
async function search(query: string) {
  const res = await patientsRoute.GET(new NextRequest(`http://localhost/api/patients?${query}`), undefined);
  return { status: res.status, body: await res.json() };
}
const uniqueEmail = (who: string) => `${who}-${crypto.randomUUID().slice(0, 8)}@example.test`;

describe("registering a patient", () => {
  it("stores the details with the phone in E.164, audits it, and the patient can be found", async () => {
    as(t.staff.reception);
    const email = uniqueEmail("Zoe.Arkwright");
    const res = await register({
      name: "  Zoë Arkwright-Valdés ", email: email.toUpperCase(), dateOfBirth: "1990-02-28", phone: "613-555-0134", language: "fr", address: "4 Birch Row", reminders: false,
    });
    expect(res.status).toBe(201);
    const row = (await Patient.findByPk(res.body.id, { include: ["user"] }))!;
    // [P] ITU-T E.164: "+", country code, national number. [M] 555-0100…0199 are fictional North American numbers.
    expect(row.phone).toBe("+16135550134");
    expect(row.language).toBe("fr");
    expect(row.reminders).toBe(false);
    expect(row.user!.email).toBe(email.toLowerCase());
    expect(row.user!.name).toBe("Zoë Arkwright-Valdés");
    expect(row.user!.role).toBe("patient");
    expect(await AuditEvent.count({ where: { subjectId: row.id, action: "patient.registered" } })).toBe(1);
    // Accent-insensitive: "zoe" finds "Zoë".
    const found = await search("q=zoe%20arkw");
    expect(found.body.patients.map((p: { id: string }) => p.id)).toEqual([row.id]);
    expect(found.body.total).toBe(1);
    expect((await search("q=6135550134")).body.patients.map((p: { id: string }) => p.id)).toContain(row.id);
    expect((await search("q=1990-02-28")).body.patients.map((p: { id: string }) => p.id)).toContain(row.id);
    expect((await search(`q=${encodeURIComponent(email.slice(0, 10))}`)).body.patients.map((p: { id: string }) => p.id)).toContain(row.id);
  });

  it.each([
    [{ name: "", email: "a@example.test", dateOfBirth: "1990-01-01" }, "name"],
    [{ name: "Ana Ruiz", email: "not-an-address", dateOfBirth: "1990-01-01" }, "email"],
    [{ name: "Ana Ruiz", email: "ana@example.test", dateOfBirth: "2023-02-29" }, "dateOfBirth"], // 2023 is not a leap year
    [{ name: "Ana Ruiz", email: "ana@example.test", dateOfBirth: "1990-13-01" }, "dateOfBirth"],
    [{ name: "Ana Ruiz", email: "ana@example.test", dateOfBirth: "2999-01-01" }, "dateOfBirth"],
    [{ name: "Ana Ruiz", email: "ana@example.test", dateOfBirth: "1990-01-01", phone: "+1 555 0134" }, "phone"], // too short for NANP
    [{ name: "Ana Ruiz", email: "ana@example.test", dateOfBirth: "1990-01-01", language: "de" }, "language"],
  ])("refuses %j with a message on %s and stores nothing", async (body, field) => {
    as(t.staff.reception);
    const before = await Patient.count({ where: { clinicId: t.clinic.id } });
    const res = await register(body);
    expect(res.status).toBe(400);
    expect(res.body.field).toBe(field);
    expect(res.body.error).toMatch(/\w{3,}/);
    expect(await Patient.count({ where: { clinicId: t.clinic.id } })).toBe(before);
  });

  it("refuses the same person twice: same e-mail, or the same folded name and date of birth", async () => {
    as(t.staff.dentist);
    const email = uniqueEmail("bjorn");
    const first = await register({ name: "Bjørn Ødegård", email, dateOfBirth: "1975-07-14" });
    expect(first.status).toBe(201);
    const sameEmail = await register({ name: "Someone Else", email: email.toUpperCase(), dateOfBirth: "1980-01-01" });
    expect(sameEmail.status).toBe(409);
    expect(sameEmail.body.existingId).toBe(first.body.id);
    const sameName = await register({ name: "BJORN  odegard", email: uniqueEmail("bjorn2"), dateOfBirth: "1975-07-14" });
    expect(sameName.status).toBe(409);
    expect(sameName.body.existingId).toBe(first.body.id);
    expect(sameName.body.error).toMatch(/already registered/);
    // Same name, another birthday: a different person.
    expect((await register({ name: "Bjørn Ødegård", email: uniqueEmail("bjorn3"), dateOfBirth: "1976-07-14" })).status).toBe(201);
  });

  it("does not name another clinic's patient when their e-mail is reused", async () => {
    const theirs = await createTestPatient(other.clinic.id, "Other Clinic Person");
    as(t.staff.reception);
    const res = await register({ name: "New Person", email: theirs.user.email, dateOfBirth: "1990-01-01" });
    expect(res.status).toBe(409);
    expect(res.body.existingId).toBeUndefined();
  });

  it("is for staff only: a patient gets 403 for registering and listing", async () => {
    const { user } = await createTestPatient(t.clinic.id, "Curious Patient");
    as(user);
    expect((await register({ name: "X Y", email: uniqueEmail("x"), dateOfBirth: "1990-01-01" })).status).toBe(403);
    expect((await search("q=")).status).toBe(403);
  });
});

describe("one patient's details", () => {
  it("another clinic's patient is a 404 for reading, changing and inviting", async () => {
    const theirs = await createTestPatient(other.clinic.id, "Hidden Person");
    as(t.staff.admin);
    expect((await patientRoute.GET(json("GET", `/api/patients/${theirs.patient.id}`), params(theirs.patient.id))).status).toBe(404);
    expect((await patientRoute.PATCH(json("PATCH", `/api/patients/${theirs.patient.id}`, { name: "Changed" }), params(theirs.patient.id))).status).toBe(404);
    expect((await inviteRoute.POST(json("POST", `/api/patients/${theirs.patient.id}/invite`), params(theirs.patient.id))).status).toBe(404);
    expect((await patientRoute.GET(json("GET", `/api/patients/not-a-uuid`), params("not-a-uuid"))).status).toBe(404);
    expect((await User.findByPk(theirs.user.id))!.name).toBe("Hidden Person");
  });

  it("staff correct details, audited with the field names only", async () => {
    as(t.staff.reception);
    const { body } = await register({ name: "Pia Lindqvist", email: uniqueEmail("pia"), dateOfBirth: "1982-05-09" });
    const res = await patientRoute.PATCH(json("PATCH", `/api/patients/${body.id}`, { phone: "+33 6 12 34 56 78", address: "9 Quai Nord" }), params(body.id));
    expect(res.status).toBe(200);
    const patient = (await res.json()).patient;
    expect(patient.phone).toBe("+33612345678");
    expect(patient.address).toBe("9 Quai Nord");
    const audit = await AuditEvent.findOne({ where: { subjectId: body.id, action: "patient.updated" } });
    expect(audit!.data).toEqual({ fields: ["phone", "address"] });
    const bad = await patientRoute.PATCH(json("PATCH", `/api/patients/${body.id}`, { dateOfBirth: "1982-02-30" }), params(body.id));
    expect(bad.status).toBe(400);
    expect((await Patient.findByPk(body.id))!.dateOfBirth).toBe("1982-05-09");
  });

  it("archiving hides the patient from the list, stops sign-in, and unarchiving restores both", async () => {
    as(t.staff.reception);
    const { body } = await register({ name: "Quentin Marchetti", email: uniqueEmail("quentin"), dateOfBirth: "1964-10-30" });
    const archive = await patientRoute.PATCH(json("PATCH", `/api/patients/${body.id}`, { archived: true }), params(body.id));
    expect(archive.status).toBe(200);
    const row = (await Patient.findByPk(body.id, { include: ["user"] }))!;
    expect(row.archivedAt).not.toBeNull();
    expect(row.user!.active).toBe(false);
    expect((await search("q=quentin")).body.total).toBe(0);
    expect((await search("q=quentin&archived=1")).body.patients.map((p: { id: string }) => p.id)).toEqual([body.id]);
    // The e-mail sign-in link is refused for an inactive account (next-auth's signIn callback).
    const verdict = await authOptions.callbacks!.signIn!({ user: { id: row.userId, email: row.user!.email }, account: { provider: "email", type: "email", providerAccountId: row.user!.email } } as never);
    expect(verdict).not.toBe(true);
    expect((await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id))).status).toBe(409);

    await patientRoute.PATCH(json("PATCH", `/api/patients/${body.id}`, { archived: false }), params(body.id));
    expect((await User.findByPk(row.userId))!.active).toBe(true);
    expect((await search("q=quentin")).body.total).toBe(1);
    const again = await authOptions.callbacks!.signIn!({ user: { id: row.userId, email: row.user!.email }, account: { provider: "email", type: "email", providerAccountId: row.user!.email } } as never);
    expect(again).toBe(true);
  });
});

describe("inviting a patient", () => {
  it("e-mails a 72-hour link whose token next-auth accepts; a new invitation replaces it; the fourth in an hour is 429", async () => {
    as(t.staff.reception);
    const email = uniqueEmail("rosa");
    const { body } = await register({ name: "Rosa Ilunga", email, dateOfBirth: "1999-03-03" });
    const detail = async () => (await (await patientRoute.GET(json("GET", `/api/patients/${body.id}`), params(body.id))).json()).patient;
    expect((await detail()).invitation.state).toBe("not_invited");

    const res = await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id));
    expect(res.status).toBe(202);
    const mail = await eventually(async () => (await caughtFor(email))[0]);
    expect(mail.subject).toContain("invites you");
    const link = new URL(mail.text!.match(/https?:\/\/\S+\/api\/auth\/callback\/email\?\S+/)![0]);
    const token = link.searchParams.get("token")!;
    expect(link.searchParams.get("email")).toBe(email);
    // [P] next-auth 4 source, core/lib/utils.js: the stored token is sha256(token + secret); use its own function.
    // The file is not in the package's exports map, so load it by path.
    const { hashToken } = createRequire(import.meta.url)(path.resolve("node_modules/next-auth/core/lib/utils.js")) as { hashToken: (t: string, o: unknown) => string };
    const stored = await sequelize.query<{ token: string; expires: Date }>(`SELECT token, expires FROM verification_tokens WHERE identifier = $1`, { bind: [email], type: "SELECT" as never });
    expect(stored).toHaveLength(1);
    expect(stored[0].token).toBe(hashToken(token, { provider: { secret: undefined }, secret: process.env.NEXTAUTH_SECRET }));
    const hours = (stored[0].expires.getTime() - Date.now()) / 3600_000;
    expect(hours).toBeGreaterThan(71.9);
    expect(hours).toBeLessThanOrEqual(72);
    expect((await detail()).invitation.state).toBe("invited");

    // A second invitation: the first link's token is gone, only the new one remains.
    expect((await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id))).status).toBe(202);
    const after = await sequelize.query<{ token: string }>(`SELECT token FROM verification_tokens WHERE identifier = $1`, { bind: [email], type: "SELECT" as never });
    expect(after).toHaveLength(1);
    expect(after[0].token).not.toBe(stored[0].token);

    expect((await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id))).status).toBe(202);
    const limited = await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id));
    expect(limited.status).toBe(429);
    expect((await limited.json()).error).toMatch(/last hour/);

    // next-auth records the sign-in through its event; staff then see "signed in".
    await authOptions.events!.signIn!({ user: { id: (await Patient.findByPk(body.id))!.userId }, account: null, isNewUser: false } as never);
    const signedIn = await detail();
    expect(signedIn.invitation.state).toBe("signed_in");
    expect(signedIn.firstSignedInAt).not.toBeNull();
  });
});

describe("the patient's own profile", () => {
  it("changes phone, language and reminders; a new e-mail waits for its link", async () => {
    const { user, patient } = await createTestPatient(t.clinic.id, "Self Service");
    as(user);
    const res = await meRoute.PATCH(json("PATCH", "/api/me", { phone: "(613) 555-0199", language: "fr", reminders: false }), undefined);
    expect(res.status).toBe(200);
    const row = (await Patient.findByPk(patient.id))!;
    expect([row.phone, row.language, row.reminders]).toEqual(["+16135550199", "fr", false]);
    expect((await meRoute.PATCH(json("PATCH", "/api/me", { language: "de" }), undefined)).status).toBe(400);
    expect((await meRoute.PATCH(json("PATCH", "/api/me", { name: "Someone" }), undefined)).status).toBe(400);

    const newEmail = uniqueEmail("self-new");
    const change = await meRoute.PATCH(json("PATCH", "/api/me", { email: newEmail }), undefined);
    expect((await change.json()).emailPending).toBe(true);
    expect((await User.findByPk(user.id))!.email).toBe(user.email);
    const mail = await eventually(async () => (await caughtFor(newEmail))[0]);
    // She chose French above, so the confirmation link is written in French.
    expect(mail.subject).toBe("Confirmez votre nouvelle adresse courriel pour Cuspal");
    expect(mail.text).toContain("Utiliser cette adresse");
    const link = new URL(mail.text!.match(/https?:\/\/\S+\/api\/me\/email\?token=[0-9a-f]+/)![0]);
    const { GET: confirm } = await import("@/app/api/me/email/route");
    const done = await confirm(new NextRequest(`http://localhost${link.pathname}${link.search}`), undefined);
    expect(done.status).toBe(303);
    expect(done.headers.get("location")).toContain("notice=email-changed");
    expect((await User.findByPk(user.id))!.email).toBe(newEmail);
    // The link works once.
    const twice = await confirm(new NextRequest(`http://localhost${link.pathname}${link.search}`), undefined);
    expect(twice.headers.get("location")).toContain("notice=email-link-expired");
  });

  it("new visits start with the patient's reminder preference", async () => {
    const { user, patient } = await createTestPatient(t.clinic.id, "Quiet Patient");
    await patient.update({ reminders: false });
    const proposal = await createTestProposal(t, patient.id);
    const session = sessionOf(user);
    // Wednesday 2027-03-10, 08:00 in Toronto (EST, UTC−5), booked a week before.
    const visit = await bookVisit({
      proposalId: proposal.id, materialId: t.materialByKey["zirconia"].id, mode: "standard",
      start: new Date("2027-03-10T13:00:00Z"), actor: { user: session }, now: new Date("2027-03-01T12:00:00Z"),
    });
    expect(visit.remindersEnabled).toBe(false);
  });

  it("is for patients only", async () => {
    as(t.staff.reception);
    expect((await meRoute.GET(json("GET", "/api/me"), undefined)).status).toBe(403);
  });
});

describe("inviting a French-speaking patient", () => {
  it("writes the invitation in the language staff registered", async () => {
    as(t.staff.reception);
    const email = uniqueEmail("amelie");
    const { body } = await register({ name: "Amélie Testpersonne", email, dateOfBirth: "1988-11-05", language: "fr" });
    expect((await inviteRoute.POST(json("POST", `/api/patients/${body.id}/invite`), params(body.id))).status).toBe(202);
    const mail = await eventually(async () => (await caughtFor(email))[0]);
    expect(mail.subject).toMatch(/ vous invite sur Cuspal$/);
    expect(mail.subject).not.toContain("invites you");
    expect(mail.text).toContain("Bonjour Amélie Testpersonne");
    expect(mail.text).toContain("Ouvrir mon compte Cuspal");
  });
});
