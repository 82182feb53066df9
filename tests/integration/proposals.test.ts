// Crown proposals: the dentist creates them, the patient sees only their own.
import { beforeAll, describe, expect, it } from "vitest";
import { Proposal } from "@/db/models";
import { proposalSchema } from "@/lib/booking/schemas";
import { createProposal, getProposal, listProposals } from "@/lib/data/proposals";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, type TestClinic } from "../support/fixtures";
import { sessionOf as session } from "../support/session";

let t: TestClinic;

beforeAll(async () => {
  t = await createTestClinic();
});

describe("crown proposals", () => {
  it("the dentist proposes a crown and only that patient sees it", async () => {
    const a = await createTestPatient(t.clinic.id, "Patient A");
    const b = await createTestPatient(t.clinic.id, "Patient B");
    const dentist = session(t.staff.dentist);
    const input = proposalSchema.parse({
      patientId: a.patient.id, tooth: "46", fee: "1250.50", note: "Cracked molar",
      options: [{ materialId: t.materialByKey["zirconia"].id, modes: ["rapid", "standard"] }],
    });
    const proposal = await createProposal({ user: dentist, input });
    expect(proposal.feeCents).toBe(125050);
    expect(proposal.dentistId).toBe(t.staff.dentist.id);

    const mine = await listProposals({ user: session(a.user) });
    expect(mine.map((p) => p.id)).toEqual([proposal.id]);
    // [P] HL7 crosswalk: FDI 46 = Universal 30; ISO 3950 quadrant 4 = lower right.
    expect(mine[0].tooth).toEqual(expect.objectContaining({ fdi: 46, universal: "30", words: "lower right first molar" }));
    expect(mine[0].materials).toEqual([{ id: t.materialByKey["zirconia"].id, key: "zirconia", name: "Zirconia", modes: ["rapid", "standard"], feeCents: 125_050 }]); // no list price in the test clinic: the proposal's fee

    expect(await listProposals({ user: session(b.user) })).toEqual([]);
    const err = await getProposal({ user: session(b.user), id: proposal.id }).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.status).toBe(404);
  });

  it("refuses a material not indicated for the tooth, a mode the material lacks, and a bad tooth code", async () => {
    const a = await createTestPatient(t.clinic.id);
    const dentist = session(t.staff.dentist);
    const before = await Proposal.count({ where: { clinicId: t.clinic.id } });
    const molarFeldspathic = proposalSchema.parse({ patientId: a.patient.id, tooth: 36, fee: 900, options: [{ materialId: t.materialByKey["feldspathic-ceramic"].id, modes: ["rapid"] }] });
    await expect(createProposal({ user: dentist, input: molarFeldspathic })).rejects.toThrow(/not indicated for a molar/);
    const pmmaRefined = proposalSchema.parse({ patientId: a.patient.id, tooth: 11, fee: 300, options: [{ materialId: t.materialByKey["pmma"].id, modes: ["refined"] }] });
    await expect(createProposal({ user: dentist, input: pmmaRefined })).rejects.toThrow(/no refined mode/);
    const badTooth = proposalSchema.safeParse({ patientId: a.patient.id, tooth: 19, fee: 300, options: [{ materialId: t.materialByKey["pmma"].id, modes: ["rapid"] }] });
    expect(badTooth.success).toBe(false);
    expect(badTooth.error!.issues[0].message).toMatch(/ISO 3950/);
    expect(await Proposal.count({ where: { clinicId: t.clinic.id } })).toBe(before);
  });

  it("keeps staff of another clinic out", async () => {
    const other = await createTestClinic();
    const a = await createTestPatient(t.clinic.id);
    const input = proposalSchema.parse({ patientId: a.patient.id, tooth: 21, fee: 1000, options: [{ materialId: other.materialByKey["zirconia"].id, modes: ["rapid"] }] });
    const err = await createProposal({ user: session(other.staff.dentist), input }).catch((e) => e);
    expect(err.status).toBe(404);
  });
});
