// Malformed and hostile requests found against the API, each answered with a clear 4xx that
// changes nothing: near-UUID ids, impossible dates, duplicate and foreign references, oversized
// (also chunked) bodies, foreign origins and wrong content types.
import { UniqueConstraintError, ForeignKeyConstraintError } from "sequelize";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { Proposal } from "@/db/models";
import { closedDaySchema } from "@/lib/domain/settings-schemas";
import { errorResponse } from "@/lib/server/api";
import { createTestPatient, createUser } from "../support/fixtures";
import { actAs, apiRequest, createWorld, snapshot, type World } from "../support/trust-world";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const proposals = await import("@/app/api/proposals/route");
const { GET: proposalSlots } = await import("@/app/api/proposals/[id]/availability/route");
const appointments = await import("@/app/api/appointments/route");
const { GET: board } = await import("@/app/api/board/route");
const outages = await import("@/app/api/board/outages/route");
const consents = await import("@/app/api/consents/route");
const { POST: reminders } = await import("@/app/api/reminders/[token]/route");
const { POST: documentsUpload } = await import("@/app/api/documents/route");

let w: World;
beforeAll(async () => {
  w = await createWorld();
}, 120_000);

const none = { params: Promise.resolve({}) } as never;
const idCtx = (id: string) => ({ params: Promise.resolve({ id }) });
const zirconia = () => w.home.materialByKey["zirconia"].id;
const proposalBody = (over: Record<string, unknown> = {}) => ({
  patientId: w.owner.patient.id, tooth: 36, fee: 1200, options: [{ materialId: zirconia(), modes: ["standard"] }], ...over,
});

async function answer(res: Response) {
  return { status: res.status, body: res.status === 303 ? null : await res.json() };
}

/** A body sent in chunks with no Content-Length, as `Transfer-Encoding: chunked` arrives. */
function chunked(bytes: number, chunk = 16 * 1024): ReadableStream<Uint8Array> {
  let sent = 0;
  return new ReadableStream({
    pull(controller) {
      if (sent >= bytes) return controller.close();
      const n = Math.min(chunk, bytes - sent);
      controller.enqueue(new TextEncoder().encode((sent === 0 ? '{"note":"' : "") + "x".repeat(n)));
      sent += n;
    },
  });
}

function streamRequest(path: string, bytes: number, type = "application/json") {
  return new Request(`http://localhost${path}`, {
    method: "POST", body: chunked(bytes), headers: { "content-type": type, origin: "http://localhost" }, duplex: "half",
  } as RequestInit) as never;
}

describe("ids and dates", () => {
  it("answers 400 naming the field for a near-UUID id instead of a 500", async () => {
    actAs(w, "owner");
    for (const id of ["-".repeat(36), "9".repeat(36), "00000000-0000-0000-0000-00000000000g", "' OR 1=1 --"]) {
      const res = await answer(await proposalSlots(apiRequest("GET", `/api/proposals/${encodeURIComponent(id)}/availability?materialId=${zirconia()}&mode=standard`), idCtx(id)));
      expect(res, id).toEqual({ status: 400, body: { error: expect.any(String), field: "id" } });
    }
  });

  it("refuses an impossible from date, and a day that does not exist, instead of rolling it over", async () => {
    actAs(w, "owner");
    for (const from of ["2099-13-45", "2027-02-30", "2027-02-29", "2027-04-31"]) {
      const res = await answer(await proposalSlots(apiRequest("GET", `/api/proposals/${w.proposal.id}/availability?materialId=${zirconia()}&mode=standard&from=${from}`), idCtx(w.proposal.id)));
      expect(res, from).toEqual({ status: 400, body: { error: expect.stringMatching(/real date/), field: "from" } });
    }
    // 2028 is a leap year (divisible by 4, not by 100) [C]: its 29 February is a real day.
    const leap = await proposalSlots(apiRequest("GET", `/api/proposals/${w.proposal.id}/availability?materialId=${zirconia()}&mode=standard&from=2028-02-29&days=1`), idCtx(w.proposal.id));
    expect(leap.status).toBe(200);

    actAs(w, "reception");
    expect(await answer(await board(apiRequest("GET", "/api/board?day=2027-02-30"), none))).toEqual({ status: 400, body: { error: expect.any(String), field: "day" } });
    const before = await snapshot(w);
    const start = "2027-02-30T09:00:00-05:00";
    const booked = await answer(await appointments.POST(apiRequest("POST", "/api/appointments", { proposalId: w.proposal.id, materialId: zirconia(), mode: "standard", start }), none));
    expect(booked).toEqual({ status: 400, body: { error: expect.stringMatching(/real ISO 8601/), field: "start" } });
    const chair = w.home.equipment.find((e) => e.kind === "chair")!.id;
    const outage = await answer(await outages.POST(apiRequest("POST", "/api/board/outages", { equipmentId: chair, start: "2027-02-30T08:00", end: "2027-03-01T08:00" }), none));
    expect(outage).toEqual({ status: 400, body: { error: expect.any(String), field: "start" } });
    expect(closedDaySchema.safeParse({ day: "2027-02-30" }).success).toBe(false);
    expect(await snapshot(w)).toEqual(before);
  });
});

describe("proposals: duplicates and references", () => {
  it("refuses the same material listed twice with a 400, storing nothing", async () => {
    actAs(w, "dentist");
    const before = await Proposal.count({ where: { clinicId: w.home.clinic.id } });
    const twice = proposalBody({ options: [{ materialId: zirconia(), modes: ["standard"] }, { materialId: zirconia(), modes: ["rapid"] }] });
    expect(await answer(await proposals.POST(apiRequest("POST", "/api/proposals", twice), none))).toEqual({
      status: 400, body: { error: "Each material can be listed only once.", field: "options" },
    });
    expect(await Proposal.count({ where: { clinicId: w.home.clinic.id } })).toBe(before);
  });

  it("lets the clinic manager name only an active dentist of the same clinic", async () => {
    actAs(w, "admin");
    const inactive = await createUser(w.home.clinic.id, "dentist");
    await inactive.update({ active: false });
    const patientAsDentist = (await createTestPatient(w.home.clinic.id)).user;
    const before = await Proposal.count({ where: { clinicId: w.home.clinic.id } });
    for (const [what, dentistId] of [
      ["unknown id", "6d0c1a2b-0000-4000-8000-000000000000"],
      ["dentist of another clinic", w.away.staff.dentist.id],
      ["a patient", patientAsDentist.id],
      ["reception", w.home.staff.reception.id],
      ["an inactive dentist", inactive.id],
    ] as const) {
      const res = await answer(await proposals.POST(apiRequest("POST", "/api/proposals", proposalBody({ dentistId })), none));
      expect(res, what).toEqual({ status: 400, body: { error: "Choose an active dentist of this clinic.", field: "dentistId" } });
    }
    const unnamed = await answer(await proposals.POST(apiRequest("POST", "/api/proposals", proposalBody()), none));
    expect(unnamed).toEqual({ status: 400, body: { error: expect.any(String), field: "dentistId" } });
    expect(await Proposal.count({ where: { clinicId: w.home.clinic.id } })).toBe(before);

    const ok = await answer(await proposals.POST(apiRequest("POST", "/api/proposals", proposalBody({ dentistId: w.home.staff.dentist.id })), none));
    expect(ok.status).toBe(201);
    expect((await Proposal.findByPk(ok.body.id))!.dentistId).toBe(w.home.staff.dentist.id);
  });

  it("answers database errors caused by input with 4xx, not 500", () => {
    const parent = Object.assign(new Error("duplicate key"), { code: "23505" });
    expect(errorResponse(new UniqueConstraintError({ parent: parent as never })).status).toBe(409);
    const fk = new ForeignKeyConstraintError({ parent: Object.assign(new Error("violates foreign key"), { code: "23503", sql: "" }) as never });
    expect(errorResponse(fk).status).toBe(404);
  });
});

describe("body caps", () => {
  it("refuses an oversized JSON body with 413 before parsing, chunked or declared", async () => {
    actAs(w, "dentist");
    const chunkedRes = await answer(await proposals.POST(streamRequest("/api/proposals", 200 * 1024), none));
    expect(chunkedRes).toEqual({ status: 413, body: { error: expect.stringMatching(/too large/) } });
    const declared = apiRequest("POST", "/api/proposals", JSON.stringify(proposalBody({ note: "x".repeat(70 * 1024) })));
    expect((await proposals.POST(declared, none)).status).toBe(413);
  });

  it("caps the reminder link's body too, which needs no sign-in", async () => {
    actAs(w, "anonymous");
    const token = await w.make.token();
    const ctx = { params: Promise.resolve({ token }) };
    expect((await reminders(streamRequest(`/api/reminders/${token}`, 200 * 1024), ctx)).status).toBe(413);
    expect((await reminders(streamRequest(`/api/reminders/${token}`, 200 * 1024, "application/x-www-form-urlencoded"), ctx)).status).toBe(413);
  });

  it("gives a signature up to its own larger cap, and no further", async () => {
    actAs(w, "owner");
    expect((await consents.POST(streamRequest("/api/consents", 300 * 1024), none)).status).toBe(400);
    expect(await answer(await consents.POST(streamRequest("/api/consents", 500 * 1024), none))).toEqual({
      status: 413, body: { error: "That signature is too large to send. Clear the box and sign again.", field: "signature" },
    });
  });
});

describe("origin and content type of mutating requests", () => {
  it("refuses a request from another site's page, and changes nothing", async () => {
    actAs(w, "dentist");
    const before = await snapshot(w);
    for (const headers of [{ origin: "https://attacker.example" }, { origin: "null" }, { origin: "http://localhost.attacker.example" }]) {
      const res = await answer(await proposals.POST(apiRequest("POST", "/api/proposals", proposalBody(), headers), none));
      expect(res, headers.origin).toEqual({ status: 403, body: { error: "This request must come from Cuspal's own pages." } });
    }
    const crossSite = apiRequest("POST", "/api/proposals", proposalBody(), { "sec-fetch-site": "cross-site" });
    crossSite.headers.delete("origin");
    expect((await proposals.POST(crossSite, none)).status).toBe(403);
    expect(await snapshot(w)).toEqual(before);
  });

  it("requires application/json on JSON routes and a multipart form on uploads", async () => {
    actAs(w, "dentist");
    const before = await snapshot(w);
    for (const type of ["text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      const res = await answer(await proposals.POST(apiRequest("POST", "/api/proposals", JSON.stringify(proposalBody()), { "content-type": type }), none));
      expect(res, type).toEqual({ status: 415, body: { error: "Send the request body as application/json." } });
    }
    // A body with no declared type at all is refused too.
    const untyped = new Request("http://localhost/api/proposals", { method: "POST", body: new TextEncoder().encode(JSON.stringify(proposalBody())), headers: { origin: "http://localhost" } });
    expect((await proposals.POST(untyped as never, none)).status).toBe(415);
    actAs(w, "owner");
    const jsonUpload = await documentsUpload(apiRequest("POST", "/api/documents", { kind: "other", title: "x" }), none);
    expect(jsonUpload.status).toBe(415);
    expect(await snapshot(w)).toEqual(before);
  });

  it("keeps the reminder link open to mail programs' one-click POST from anywhere (RFC 8058)", async () => {
    actAs(w, "anonymous");
    const token = await w.make.token();
    const form = new URLSearchParams({ "List-Unsubscribe": "One-Click" });
    const res = await reminders(
      new Request(`http://localhost/api/reminders/${token}`, { method: "POST", body: form, headers: { origin: "https://mail.example" } }) as never,
      { params: Promise.resolve({ token }) },
    );
    expect(await answer(res)).toEqual({ status: 200, body: { remindersEnabled: false } });
  });
});
