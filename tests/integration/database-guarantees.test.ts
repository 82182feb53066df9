// What the database itself refuses, whoever asks: TRUNCATE of the kept records (even as the
// owner), changes to the audit trail, treatment without a reviewed consent (bypassing the app's
// hooks with plain SQL), and anything that needs table ownership from the role the app uses.
import { randomUUID } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Appointment } from "@/db/models";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";

const app = new pg.Client({ connectionString: process.env.DATABASE_URL });
const owner = new pg.Client({ connectionString: process.env.OWNER_DATABASE_URL });
const separateRoles = Boolean(process.env.OWNER_DATABASE_URL) && process.env.OWNER_DATABASE_URL !== process.env.DATABASE_URL;

const refusal = (client: pg.Client, sql: string, values: unknown[] = []) =>
  client.query(sql, values).then(() => "done", (e: Error) => e.message);

let t: TestClinic;
let template: { id: string; version: number };

beforeAll(async () => {
  await app.connect();
  await owner.connect();
  t = await createTestClinic();
  const { rows } = await app.query(
    "INSERT INTO consent_templates (clinic_id, version, title, sections) VALUES ($1, 1, 'Test consent', '[]'::jsonb) RETURNING id, version",
    [t.clinic.id],
  );
  template = rows[0];
});

afterAll(async () => {
  await app.end();
  await owner.end();
});

async function visit(status: Appointment["status"] = "checked_in") {
  const { patient } = await createTestPatient(t.clinic.id, "Guarded Patient");
  const proposal = await createTestProposal(t, patient.id);
  const startsAt = new Date(Date.now() + 3 * 24 * 3600 * 1000);
  return Appointment.create({
    clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
    materialId: t.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status, startsAt,
    endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: t.equipment.find((e) => e.kind === "chair")!.id,
    millId: t.equipment.find((e) => e.kind === "mill")!.id, furnaceId: null, feeCents: 145000, createdBy: null,
  });
}

/** A consent row straight into the table, in the given state (the consent tests cover how it gets there). */
async function consentFor(v: Appointment, status: "signed" | "reviewed") {
  const { rows: [row] } = await app.query(
    `INSERT INTO consents (clinic_id, appointment_id, patient_id, status, template_id, template_version, answers, acknowledged,
       electronic_records_version, consent_text, text_sha256, typed_name, signature_png, signed_at, reviewed_at, reviewed_by)
     VALUES ($1, $2, $3, $4, $5, $6, '{}'::jsonb, '{}', 'v1', 'text', repeat('a', 64), 'Guarded Patient', '\\x00'::bytea, now(),
       CASE WHEN $4 = 'reviewed' THEN now() END, CASE WHEN $4 = 'reviewed' THEN $7::uuid END)
     RETURNING id`,
    [t.clinic.id, v.id, v.patientId, status, template.id, template.version, t.staff.dentist.id],
  );
  return row.id as string;
}

describe("TRUNCATE of kept records", () => {
  for (const table of ["consents", "consent_pdfs", "consent_templates", "audit_events"]) {
    it(`is refused on ${table} even for the owner`, async () => {
      // The owner may truncate any table by privilege; the statement trigger still says no.
      expect(await refusal(owner, `TRUNCATE ${table} CASCADE`)).toMatch(/TRUNCATE is refused/);
    });
  }

  it.skipIf(!separateRoles)("is not even allowed to the app role", async () => {
    expect(await refusal(app, "TRUNCATE audit_events")).toMatch(/permission denied/);
    expect(await refusal(app, "TRUNCATE consents CASCADE")).toMatch(/permission denied/);
    // Nor on tables without a trigger: TRUNCATE is simply not granted.
    expect(await refusal(app, "TRUNCATE sign_in_attempts")).toMatch(/permission denied/);
  });

  it("reaching the kept tables through CASCADE from a parent is refused as well", async () => {
    expect(await refusal(owner, "TRUNCATE appointments CASCADE")).toMatch(/TRUNCATE is refused/);
  });
});

describe("the audit trail is append-only", () => {
  let id: string;
  beforeAll(async () => {
    const { rows } = await app.query(
      "INSERT INTO audit_events (clinic_id, actor_user_id, action, subject_type, subject_id) VALUES ($1, $2, 'test.kept', 'test', $3) RETURNING id",
      [t.clinic.id, t.staff.admin.id, randomUUID()],
    );
    id = rows[0].id;
  });

  it("refuses UPDATE and DELETE, for the owner by trigger", async () => {
    expect(await refusal(owner, "UPDATE audit_events SET action = 'test.changed' WHERE id = $1", [id])).toMatch(/never changed or deleted/);
    expect(await refusal(owner, "DELETE FROM audit_events WHERE id = $1", [id])).toMatch(/never changed or deleted/);
    // Clearing the actor by hand while the user still exists is a change like any other.
    expect(await refusal(owner, "UPDATE audit_events SET actor_user_id = NULL WHERE id = $1", [id])).toMatch(/never changed or deleted/);
    const { rows } = await owner.query("SELECT action, actor_user_id FROM audit_events WHERE id = $1", [id]);
    expect(rows[0]).toEqual({ action: "test.kept", actor_user_id: t.staff.admin.id });
  });

  it.skipIf(!separateRoles)("refuses UPDATE and DELETE for the app role by privilege", async () => {
    expect(await refusal(app, "UPDATE audit_events SET action = 'test.changed' WHERE id = $1", [id])).toMatch(/permission denied/);
    expect(await refusal(app, "DELETE FROM audit_events WHERE id = $1", [id])).toMatch(/permission denied/);
  });

  it("lets the foreign key clear the actor once that user is deleted", async () => {
    const { rows: [u] } = await app.query(
      "INSERT INTO users (id, email, name, role, clinic_id) VALUES (gen_random_uuid(), $1, 'Leaving', 'reception', $2) RETURNING id",
      [`leaving-${randomUUID()}@cuspal.test`, t.clinic.id],
    );
    const { rows: [e] } = await app.query(
      "INSERT INTO audit_events (clinic_id, actor_user_id, action, subject_type, subject_id) VALUES ($1, $2, 'test.left', 'user', $3) RETURNING id",
      [t.clinic.id, u.id, u.id],
    );
    await app.query("DELETE FROM users WHERE id = $1", [u.id]);
    const { rows } = await app.query("SELECT action, actor_user_id FROM audit_events WHERE id = $1", [e.id]);
    expect(rows[0]).toEqual({ action: "test.left", actor_user_id: null });
  });
});

describe("treatment needs a reviewed consent, in the database", () => {
  const start = (id: string, status = "in_progress") => refusal(app, "UPDATE appointments SET status = $2 WHERE id = $1", [id, status]);

  it("refuses in_progress and completed without any consent, and a visit inserted already treated", async () => {
    const v = await visit();
    expect(await start(v.id)).toMatch(/reviewed before treatment starts/);
    expect(await start(v.id, "completed")).toMatch(/reviewed before treatment starts/);
    const copy = await refusal(
      owner,
      `INSERT INTO appointments (clinic_id, proposal_id, patient_id, dentist_id, material_id, mode, tooth, status, starts_at, ends_at, chair_id, mill_id, fee_cents)
       SELECT clinic_id, proposal_id, patient_id, dentist_id, material_id, mode, tooth, 'completed', starts_at, ends_at, chair_id, mill_id, fee_cents
       FROM appointments WHERE id = $1`,
      [v.id],
    );
    expect(copy).toMatch(/reviewed before treatment starts/);
    expect((await app.query("SELECT status FROM appointments WHERE id = $1", [v.id])).rows[0].status).toBe("checked_in");
  });

  it("refuses a signed but unreviewed consent, then allows it once reviewed", async () => {
    const unreviewed = await visit();
    await consentFor(unreviewed, "signed");
    expect(await start(unreviewed.id)).toMatch(/reviewed before treatment starts/);

    const reviewed = await visit();
    await consentFor(reviewed, "reviewed");
    expect(await start(reviewed.id)).toBe("done");
    expect(await start(reviewed.id, "completed")).toBe("done");
    // Other changes to a treated visit are not the trigger's business.
    expect(await refusal(app, "UPDATE appointments SET status_reason = 'note' WHERE id = $1", [reviewed.id])).toBe("done");
  });
});

describe.skipIf(!separateRoles)("the app's role", () => {
  it("owns no table, sequence, function, type or schema", async () => {
    const { rows } = await app.query(`
      SELECT (SELECT count(*) FROM pg_class WHERE relowner = r.oid)::int AS relations,
             (SELECT count(*) FROM pg_proc WHERE proowner = r.oid)::int AS functions,
             (SELECT count(*) FROM pg_type WHERE typowner = r.oid)::int AS types,
             (SELECT count(*) FROM pg_namespace WHERE nspowner = r.oid)::int AS schemas,
             r.rolsuper AS superuser, r.rolcreaterole AS createrole, r.rolcreatedb AS createdb
        FROM pg_roles r WHERE r.rolname = current_user`);
    expect(rows[0]).toEqual({ relations: 0, functions: 0, types: 0, schemas: 0, superuser: false, createrole: false, createdb: false });
  });

  it("cannot disable a trigger, alter or drop a table, or create one", async () => {
    expect(await refusal(app, "ALTER TABLE consents DISABLE TRIGGER consents_guard")).toMatch(/must be owner/);
    expect(await refusal(app, "ALTER TABLE audit_events DISABLE TRIGGER ALL")).toMatch(/must be owner/);
    expect(await refusal(app, "ALTER TABLE appointments DISABLE TRIGGER appointments_treatment_needs_consent")).toMatch(/must be owner/);
    expect(await refusal(app, "DROP TABLE consent_pdfs")).toMatch(/must be owner/);
    expect(await refusal(app, "CREATE TABLE intruder (id int)")).toMatch(/permission denied/);
    expect(await refusal(app, "SET session_replication_role = replica")).toMatch(/permission denied/);
  });

  it("can make a new job queue, whose table the owner owns, but cannot delete one", async () => {
    const name = `test-${randomUUID().slice(0, 8)}`;
    await app.query("SELECT pgboss.create_queue($1, $2::json)", [name, JSON.stringify({ policy: "standard" })]);
    const ownerName = (await owner.query("SELECT current_user AS name")).rows[0].name;
    const { rows } = await owner.query(
      `SELECT r.rolname FROM pgboss.queue q
         JOIN pg_class c ON c.relname = q.partition_name
         JOIN pg_namespace n ON n.oid = c.relnamespace AND n.nspname = 'pgboss'
         JOIN pg_roles r ON r.oid = c.relowner
        WHERE q.name = $1`,
      [name],
    );
    expect(rows).toEqual([{ rolname: ownerName }]);
    expect(await refusal(app, "SELECT pgboss.delete_queue($1)", [name])).toMatch(/permission denied/);
    await owner.query("SELECT pgboss.delete_queue($1)", [name]);
  });

  it("gets rights on tables made after the grant without a grant of its own (default privileges)", async () => {
    const table = `later_${randomUUID().slice(0, 8)}`;
    await owner.query(`CREATE TABLE ${table} (id bigserial PRIMARY KEY, note text)`);
    try {
      expect(await refusal(app, `INSERT INTO ${table} (note) VALUES ('from the app')`)).toBe("done");
      expect((await app.query(`SELECT note FROM ${table}`)).rows).toEqual([{ note: "from the app" }]);
      expect(await refusal(app, `TRUNCATE ${table}`)).toMatch(/permission denied/);
    } finally {
      await owner.query(`DROP TABLE ${table}`);
    }
  });
});
