// The clinic's jurisdiction (country and province or state): read for consents, set by the clinic manager.
import "server-only";
import { z } from "zod";
import { Clinic, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { JURISDICTIONS, jurisdictionOf } from "@/lib/domain/jurisdiction";
import { recordAudit } from "@/lib/server/audit";
import { forbidden, notFound } from "@/lib/server/errors";

export const jurisdictionSchema = z.object({
  jurisdiction: z.enum(JURISDICTIONS.map((j) => j.code) as [string, ...string[]], { message: "Choose where the clinic practises." }),
});

export async function getJurisdiction({ clinicId }: { clinicId: string }) {
  const clinic = await Clinic.findByPk(clinicId, { attributes: ["id", "jurisdiction"] });
  if (!clinic) throw notFound("The clinic");
  return jurisdictionOf(clinic.jurisdiction);
}

/** Changes the jurisdiction for consents signed from now on; signed ones keep their own text. */
export async function setJurisdiction(opts: { user: SessionUser; input: unknown; ip: string | null; userAgent: string | null }) {
  if (opts.user.role !== "admin" || !opts.user.clinicId) throw forbidden();
  const { jurisdiction } = jurisdictionSchema.parse(opts.input);
  const clinicId = opts.user.clinicId;
  await sequelize.transaction(async (transaction) => {
    const clinic = await Clinic.findByPk(clinicId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!clinic) throw notFound("The clinic");
    const from = clinic.jurisdiction;
    if (from === jurisdiction) return;
    await clinic.update({ jurisdiction }, { transaction });
    await recordAudit(
      { clinicId, actorUserId: opts.user.id, action: "clinic.jurisdiction_changed", subjectType: "clinic", subjectId: clinicId, ip: opts.ip, userAgent: opts.userAgent, data: { from, to: jurisdiction } },
      transaction,
    );
  });
}
