// The clinic manager's English and French material texts against the real PostgreSQL: saved in both
// languages and read back by the patient side, refused for other staff and other clinics, the
// both-languages cautions rule enforced on the server, and every save audited.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { AuditEvent, Material } from "@/db/models";
import { saveMaterialTextsAction } from "@/app/(clinic)/clinic/settings/materials/actions";
import { listMaterialTexts, saveMaterialTexts } from "@/lib/data/materials";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { sessionOf, signInAs, signOut } from "../support/session";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());
vi.mock("next/headers", () => ({ headers: async () => new Headers({ "user-agent": "vitest" }) }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let t: TestClinic;

beforeAll(async () => {
  t = await createTestClinic();
});

const form = (materialId: string) => ({
  materialId,
  en: { name: "Zirconia", description: "A strong tooth-coloured ceramic.", pros: "Strongest option\n\n  Little tooth removed  ", cautions: "Less translucent\nAdds furnace time" },
  fr: { name: "Zircone", description: "Une céramique résistante de la couleur des dents.", pros: "L'option la plus résistante", cautions: "Moins translucide\nAjoute du temps de four" },
});

async function rejection(p: Promise<unknown>): Promise<unknown> {
  return p.then(() => null, (e) => e);
}

describe("material texts", () => {
  it("saves both languages through the manager's action; the French patient view shows the French cautions", async () => {
    const zr = t.materialByKey["zirconia"];
    signInAs(t.staff.admin);
    const state = await saveMaterialTextsAction(form(zr.id));
    signOut();
    expect(state).toEqual({ ok: true, message: expect.stringMatching(/saved/) });
    const row = (await Material.findByPk(zr.id))!;
    // Blank lines are dropped and each line trimmed.
    expect(row.pros).toEqual(["Strongest option", "Little tooth removed"]);
    expect(row.cautions).toEqual(["Less translucent", "Adds furnace time"]);
    expect(materialTexts(row, "fr").cautions).toEqual(["Moins translucide", "Ajoute du temps de four"]);
    expect(materialTexts(row, "fr").description).toBe("Une céramique résistante de la couleur des dents.");
    expect(materialTexts(row, "en").cautions).toEqual(["Less translucent", "Adds furnace time"]);
    expect(materialName(row, "fr")).toBe("Zircone");
    const listed = (await listMaterialTexts({ clinicId: t.clinic.id })).find((m) => m.id === zr.id)!;
    expect(listed.fr?.cautions).toEqual(["Moins translucide", "Ajoute du temps de four"]);

    const audits = await AuditEvent.findAll({ where: { subjectId: zr.id, action: "settings.material_texts" } });
    expect(audits).toHaveLength(1);
    expect(audits[0].actorUserId).toBe(t.staff.admin.id);
    expect(audits[0].clinicId).toBe(t.clinic.id);
    expect((audits[0].data as { after: { fr: { cautions: string[] } } }).after.fr.cautions).toEqual(["Moins translucide", "Ajoute du temps de four"]);
  });

  it("refuses reception and the dentist, in the action and in the data function, changing nothing", async () => {
    const ld = t.materialByKey["lithium-disilicate"];
    const before = (await Material.findByPk(ld.id))!.get({ plain: true });
    signInAs(t.staff.reception);
    const state = await saveMaterialTextsAction(form(ld.id));
    signOut();
    expect(state.ok).toBe(false);
    for (const who of [t.staff.reception, t.staff.dentist]) {
      const err = await rejection(saveMaterialTexts({ user: sessionOf(who) }, form(ld.id)));
      expect(err).toBeInstanceOf(AppError);
      expect((err as AppError).status).toBe(403);
    }
    const after = (await Material.findByPk(ld.id))!.get({ plain: true });
    expect(after.cautions).toEqual(before.cautions);
    expect(after.translations).toEqual(before.translations);
    expect(await AuditEvent.count({ where: { subjectId: ld.id, action: "settings.material_texts" } })).toBe(0);
  });

  it("gives another clinic's manager a 404 for this clinic's material", async () => {
    const other = await createTestClinic();
    const ld = t.materialByKey["lithium-disilicate"];
    const err = await rejection(saveMaterialTexts({ user: sessionOf(other.staff.admin) }, form(ld.id)));
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).status).toBe(404);
    expect(await AuditEvent.count({ where: { subjectId: ld.id, action: "settings.material_texts" } })).toBe(0);
  });

  it("refuses removing every French caution while the English has some, with a clear message, changing nothing", async () => {
    const fc = t.materialByKey["feldspathic-ceramic"];
    const before = (await Material.findByPk(fc.id))!;
    expect(before.translations.fr?.cautions.length).toBeGreaterThan(0);
    const input = { ...form(fc.id), fr: { ...form(fc.id).fr, cautions: "\n  \n" } };
    signInAs(t.staff.admin);
    const state = await saveMaterialTextsAction(input);
    signOut();
    expect(state.ok).toBe(false);
    if (state.ok) return;
    expect(state.message).toMatch(/Give the French cautions too/);
    expect(state.fieldErrors?.["fr.cautions"]).toMatch(/French reader would miss/);
    const after = (await Material.findByPk(fc.id))!;
    expect(after.translations).toEqual(before.translations);
    expect(after.cautions).toEqual(before.cautions);
    expect(after.name).toBe(before.name);
    expect(await AuditEvent.count({ where: { subjectId: fc.id, action: "settings.material_texts" } })).toBe(0);
  });
});
