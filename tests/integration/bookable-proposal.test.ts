// The one-query proposal read behind the availability route: the same access rule as the full
// proposal read (a patient's own, a staff member's clinic's, else 404) and the same options.
import { beforeAll, describe, expect, it } from "vitest";
import type { SessionUser } from "@/lib/auth/session";
import { allowedOption, getBookableProposal, getProposal } from "@/lib/data/proposals";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { sessionOf } from "../support/session";

let t: TestClinic;
let other: TestClinic;
let owner: SessionUser;
let stranger: SessionUser;
let proposalId: string;

const status = (p: Promise<unknown>) => p.then(() => 200, (e) => (e instanceof AppError ? e.status : 500));

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
  const mine = await createTestPatient(t.clinic.id);
  const theirs = await createTestPatient(t.clinic.id);
  owner = sessionOf(mine.user);
  stranger = sessionOf(theirs.user);
  proposalId = (await createTestProposal(t, mine.patient.id, { allow: { zirconia: ["rapid", "standard"], "lithium-disilicate": ["standard"] } })).id;
});

describe("getBookableProposal", () => {
  it("answers the patient and the clinic's staff with what the full read holds", async () => {
    const full = (await getProposal({ user: owner, id: proposalId })).row;
    for (const user of [owner, sessionOf(t.staff.reception)]) {
      const row = await getBookableProposal({ user, id: proposalId });
      expect({ clinicId: row.clinicId, patientId: row.patientId, dentistId: row.dentistId, tooth: row.tooth, status: row.status })
        .toEqual({ clinicId: full.clinicId, patientId: full.patientId, dentistId: full.dentistId, tooth: full.tooth, status: full.status });
      const options = (o: { materialId: string; modes: string[] }[]) => o.map((x) => `${x.materialId} ${[...x.modes].sort().join(",")}`).sort();
      expect(options(row.options)).toEqual(options(full.options!));
      expect(allowedOption(row, t.materialByKey["zirconia"].id, "rapid").material?.name).toBe(t.materialByKey["zirconia"].name);
      expect(() => allowedOption(row, t.materialByKey["lithium-disilicate"].id, "rapid")).toThrow(AppError);
    }
  });

  it("gives another patient, another clinic's staff and a malformed id a 404", async () => {
    expect(await status(getBookableProposal({ user: stranger, id: proposalId }))).toBe(404);
    expect(await status(getBookableProposal({ user: sessionOf(other.staff.admin), id: proposalId }))).toBe(404);
    expect(await status(getBookableProposal({ user: owner, id: "not-an-id" }))).toBe(404);
    expect(await status(getBookableProposal({ user: owner, id: "00000000-0000-4000-8000-000000000000" }))).toBe(404);
  });
});
