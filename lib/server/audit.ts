// Writes audit events; pass the caller's transaction so the change and its record commit together.
import type { Transaction } from "sequelize";
import { AuditEvent } from "@/db/models";

export type AuditInput = {
  clinicId: string | null;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId: string;
  ip?: string | null;
  userAgent?: string | null;
  data?: Record<string, unknown>;
};

export async function recordAudit(input: AuditInput, transaction?: Transaction) {
  return AuditEvent.create(
    { ...input, ip: input.ip ?? null, userAgent: input.userAgent ?? null, data: input.data ?? {} },
    { transaction },
  );
}
