import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { getVisitMoney } from "@/lib/data/payments";
import { isoInZone } from "@/lib/domain/time-zone";
import { idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** One visit for its patient or the clinic's staff, with its money: fee, plan estimate, deposit, balance. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (_req, { params }) => {
  const user = await requireUser();
  const { id } = await idParams(params, "id");
  const { visit, clinic, money } = await getVisitMoney({ user }, id);
  return NextResponse.json({
    id: visit.id,
    status: visit.status,
    proposalId: visit.proposalId,
    materialId: visit.materialId,
    mode: visit.mode,
    tooth: visit.tooth,
    timezone: clinic.timeZone,
    start: isoInZone(visit.startsAt, clinic.timeZone),
    end: isoInZone(visit.endsAt, clinic.timeZone),
    feeCents: money.feeCents,
    currency: money.currency,
    planShareEstimateCents: money.planShareEstimateCents,
    patientShareCents: money.patientShareCents,
    balanceDueCents: money.balanceDueCents,
    deposit: money.deposit,
  });
});
