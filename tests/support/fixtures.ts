// Test fixtures: each integration test file makes its own clinic, so files can run in parallel
// against the same database without seeing each other's rows.
import { randomUUID } from "node:crypto";
import { Clinic, Equipment, Material, OpeningHour, Patient, Proposal, ProposalMaterial, User } from "@/db/models";
import { seedCatalogue } from "@/db/seed/demo-clinic";
import type { Role } from "@/db/models/user";
import type { Mode } from "@/lib/domain/types";
import "@/lib/mail/hooks";

export type TestClinic = Awaited<ReturnType<typeof createTestClinic>>;

export async function createTestClinic(opts: {
  timeZone?: string;
  chairs?: number;
  mills?: number;
  furnaces?: number;
  settings?: Record<string, unknown>;
  requireTwoFactor?: boolean;
} = {}) {
  const tag = randomUUID().slice(0, 8);
  const clinic = await Clinic.create({
    name: `Test clinic ${tag}`,
    slug: `test-${tag}`,
    timeZone: opts.timeZone ?? "America/Toronto",
    address: "1 Test Street",
    phone: null,
    requireTwoFactor: opts.requireTwoFactor ?? false,
    settings: { slotMinutes: 15, bufferMinutes: 10, minNoticeMinutes: 120, cancelCutoffHours: 24, reminderHoursBefore: [48, 2], ...opts.settings },
  });
  await seedCatalogue(clinic.id);
  const hours = [1, 2, 3, 4, 5].flatMap((weekday) => [
    { clinicId: clinic.id, weekday, opens: "08:00", closes: "12:30" },
    { clinicId: clinic.id, weekday, opens: "13:30", closes: "18:00" },
  ]);
  hours.push({ clinicId: clinic.id, weekday: 6, opens: "09:00", closes: "13:00" });
  await OpeningHour.bulkCreate(hours);
  const kinds = [
    ...Array.from({ length: opts.chairs ?? 2 }, (_, i) => ({ kind: "chair" as const, name: `Chair ${i + 1}` })),
    ...Array.from({ length: opts.mills ?? 1 }, (_, i) => ({ kind: "mill" as const, name: `Mill ${i + 1}` })),
    ...Array.from({ length: opts.furnaces ?? 1 }, (_, i) => ({ kind: "furnace" as const, name: `Furnace ${i + 1}` })),
  ];
  const equipment = await Equipment.bulkCreate(kinds.map((k) => ({ ...k, clinicId: clinic.id })), { returning: true });
  const staff: Record<Exclude<Role, "patient">, User> = {
    reception: await createUser(clinic.id, "reception"),
    dentist: await createUser(clinic.id, "dentist"),
    admin: await createUser(clinic.id, "admin"),
  };
  const materials = await Material.findAll({ where: { clinicId: clinic.id }, include: ["modes"] });
  const materialByKey = Object.fromEntries(materials.map((m) => [m.key, m]));
  return { clinic, equipment, staff, materials, materialByKey, tag };
}

export async function createUser(clinicId: string, role: Role, name = `Test ${role}`) {
  return User.create({ email: `${role}-${randomUUID()}@cuspal.test`, name, role, clinicId, passwordHash: null, emailVerified: null });
}

export async function createTestPatient(clinicId: string, name = "Test Patient") {
  const user = await createUser(clinicId, "patient", name);
  const patient = await Patient.create({ userId: user.id, clinicId, dateOfBirth: "1980-01-01", phone: null });
  return { user, patient };
}

export async function createTestProposal(
  t: TestClinic,
  patientId: string,
  options: { tooth?: number; allow?: Record<string, Mode[]>; feeCents?: number } = {},
) {
  const proposal = await Proposal.create({
    clinicId: t.clinic.id,
    patientId,
    dentistId: t.staff.dentist.id,
    tooth: options.tooth ?? 36,
    feeCents: options.feeCents ?? 120000,
    note: null,
  });
  const allow = options.allow ?? { zirconia: ["rapid", "standard"], "lithium-disilicate": ["standard"] };
  await ProposalMaterial.bulkCreate(
    Object.entries(allow).map(([key, modes]) => ({ proposalId: proposal.id, materialId: t.materialByKey[key].id, modes })),
  );
  return proposal;
}
