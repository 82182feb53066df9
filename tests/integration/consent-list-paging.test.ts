// The clinic's consent list a page at a time through the route handler, against the real
// PostgreSQL: every consent exactly once across pages even when many share one timestamp (and
// two differ by less than a millisecond), bad paging input refused with its field, and another
// clinic's consents never on the page. The session is faked.
import { NextRequest } from "next/server";
import { QueryTypes } from "sequelize";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { Appointment, sequelize } from "@/db/models";
import { encodeCursor } from "@/lib/domain/list-cursor";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { signInAs, signOut } from "../support/session";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const { GET } = await import("@/app/api/consents/route");

type Row = { id: string; status: string; createdAt: string };
type Page = { consents: (Row & { appointmentId: string; patient: string })[]; nextCursor: string | null };

let t: TestClinic;
let other: TestClinic;
let mine: { id: string; at: string }[] = [];
let theirs: { id: string; at: string }[] = [];

// Most rows share one instant; two sit half a millisecond later, which a millisecond cursor would blur.
const SAME = "2026-03-02T15:00:00.000000Z";
const TIMES = [SAME, SAME, SAME, SAME, SAME, "2026-03-02T15:00:00.000500Z", "2026-03-02T15:00:00.000500Z", "2026-03-01T09:30:00.000000Z", SAME];

/** Pending consents (one visit each) whose record time is set exactly, as the list orders by it. */
async function consentsAt(clinic: TestClinic, times: string[]) {
  const out: { id: string; at: string }[] = [];
  for (const [i, at] of times.entries()) {
    const { patient } = await createTestPatient(clinic.clinic.id, `Paging Patient ${i}`);
    const proposal = await createTestProposal(clinic, patient.id);
    const startsAt = new Date(Date.UTC(2026, 2, 10, 14, i * 5));
    const visit = await Appointment.create({
      clinicId: clinic.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: clinic.staff.dentist.id,
      materialId: clinic.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status: "confirmed", startsAt,
      endsAt: new Date(startsAt.getTime() + 90 * 60_000), chairId: clinic.equipment[0].id, millId: clinic.equipment.find((e) => e.kind === "mill")!.id,
      furnaceId: null, feeCents: 120000, createdBy: null,
    });
    const [row] = await sequelize.query<{ id: string }>(
      "INSERT INTO consents (clinic_id, appointment_id, patient_id, created_at) VALUES ($1, $2, $3, $4::timestamptz) RETURNING id",
      { bind: [clinic.clinic.id, visit.id, patient.id, at], type: QueryTypes.SELECT },
    );
    out.push({ id: row.id, at });
  }
  return out;
}

/** Newest first, then by id descending: the documented order, computed here without the database. */
const expectedOrder = (rows: { id: string; at: string }[]) =>
  [...rows].sort((a, b) => (a.at === b.at ? (a.id < b.id ? 1 : -1) : a.at < b.at ? 1 : -1)).map((r) => r.id);

async function get(query: string) {
  const res = await GET(new NextRequest(`http://localhost/api/consents${query}`), undefined);
  return { status: res.status, body: await res.json() };
}

/** Follows nextCursor from the first page to the last. */
async function walk(query: string) {
  const pages: Page[] = [];
  let cursor: string | null = null;
  do {
    const sep = query ? "&" : "?";
    const { status, body } = await get(`${query}${cursor ? `${sep}cursor=${encodeURIComponent(cursor)}` : ""}`);
    expect(status).toBe(200);
    pages.push(body as Page);
    cursor = (body as Page).nextCursor;
  } while (cursor && pages.length < 50);
  return pages;
}

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
  mine = await consentsAt(t, TIMES);
  // The other clinic's consents share the very same instants, so only the clinic filter keeps them out.
  theirs = await consentsAt(other, TIMES.slice(0, 4));
});

afterEach(() => signOut());

describe("the consent list, a page at a time", () => {
  it("gives every consent exactly once, in order, across pages of 2 with equal timestamps", async () => {
    signInAs(t.staff.reception);
    const pages = await walk("?limit=2");
    const ids = pages.flatMap((p) => p.consents.map((c) => c.id));
    expect(ids).toEqual(expectedOrder(mine));
    expect(new Set(ids).size).toBe(TIMES.length);
    expect(pages).toHaveLength(Math.ceil(TIMES.length / 2));
    expect(pages.at(-1)!.nextCursor).toBeNull();
    expect(pages.slice(0, -1).every((p) => p.consents.length === 2 && typeof p.nextCursor === "string")).toBe(true);
    expect(pages[0].consents[0]).toMatchObject({ status: "pending", patient: expect.stringMatching(/^Paging Patient \d$/) });
  });

  it("defaults to 50 a page and keeps the status filter across pages", async () => {
    signInAs(t.staff.dentist);
    const first = await get("");
    expect(first.status).toBe(200);
    expect(first.body.consents.map((c: Row) => c.id)).toEqual(expectedOrder(mine));
    expect(first.body.nextCursor).toBeNull();
    const pending = await walk("?status=pending&limit=4");
    expect(pending.flatMap((p) => p.consents.map((c) => c.id))).toEqual(expectedOrder(mine));
    expect((await walk("?status=reviewed&limit=4")).flatMap((p) => p.consents)).toEqual([]);
  });

  it("never shows another clinic's consents, even from a cursor made in that clinic", async () => {
    signInAs(other.staff.admin);
    const pages = await walk("?limit=3");
    expect(pages.flatMap((p) => p.consents.map((c) => c.id))).toEqual(expectedOrder(theirs));
    signInAs(t.staff.admin);
    const cursor = encodeCursor({ at: theirs[0].at.replace(".000000Z", ".000001Z"), id: theirs[0].id });
    const { body } = await get(`?limit=100&cursor=${cursor}`);
    const seen = (body as Page).consents.map((c) => c.id);
    expect(seen.length).toBeGreaterThan(0);
    expect(seen.every((id) => mine.some((m) => m.id === id))).toBe(true);
  });

  it("refuses a bad cursor or limit with 400, the field and a clear message, and changes nothing", async () => {
    signInAs(t.staff.reception);
    const count = async () => (await sequelize.query<{ n: string }>("SELECT count(*) AS n FROM consents WHERE clinic_id = $1", { bind: [t.clinic.id], type: QueryTypes.SELECT }))[0].n;
    const before = await count();
    const message = "That page link is not valid. Start again from the newest consents.";
    const forged = Buffer.from(`2026-13-02T15:00:00.000000Z|${mine[0].id}`).toString("base64url");
    for (const cursor of ["not a cursor", "bm90LWEtY3Vyc29y", forged, "x".repeat(300)]) {
      expect(await get(`?cursor=${encodeURIComponent(cursor)}`)).toEqual({ status: 400, body: { error: message, field: "cursor" } });
    }
    for (const limit of ["0", "101", "2.5", "many"]) {
      expect(await get(`?limit=${limit}`)).toEqual({ status: 400, body: { error: "Limit must be a whole number from 1 to 100.", field: "limit" } });
    }
    expect(await count()).toBe(before);
  });
});
