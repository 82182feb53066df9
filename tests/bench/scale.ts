// A clinic group at scale: 20 clinics, 50,000 patients and 200,000 visits in the bench database,
// generated with set-based SQL. Then the day board, patient search, availability and the consent
// list each run through their data function; every figure is printed beside its target, with the
// top lines of each query's plan. Seeding happens once: a later run reuses the clinics it finds.
import { performance } from "node:perf_hooks";
import { createRequire } from "node:module";
import { QueryTypes } from "sequelize";
import { Clinic, Material, Proposal, ProposalMaterial, User, sequelize } from "@/db/models";
import { seedCatalogue } from "@/db/seed/demo-clinic";
import { addDays, localDate } from "@/lib/domain/time-zone";
import { ensureDatabase, ms, root, run as runCommand, stats } from "./support";

const CLINICS = 20;
const PATIENTS = 50_000;
const VISITS = 200_000;
const ZONE = "America/Toronto";
// Each clinic: open 07:00–21:00; 3 chairs, visits of 60 minutes on the hour from 07:00 to 16:00 (the
// evenings stay free for availability to find), the chairs staggered by
// 20 minutes so one mill's 20-minute window per visit never overlaps another's (the exclusion
// constraint holds); 30 visits a clinic a day, 10,000 a clinic over about 333 days around today.
const PER_CLINIC = VISITS / CLINICS;
const SLOTS_A_DAY = 10;
const CHAIRS = 3;
const DAYS = Math.ceil(PER_CLINIC / (SLOTS_A_DAY * CHAIRS));
const PAST_DAYS = Math.floor(DAYS * 0.7);

export const TARGET = { p50: 50, p95: 150 };
const BIG = ["appointments", "appointment_stages", "reservations", "patients", "users", "consents", "proposals", "proposal_materials"];

async function count(sql: string): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(sql, { type: QueryTypes.SELECT });
  return Number(row.n);
}

async function seed(): Promise<number> {
  const t0 = performance.now();
  const clinics = [];
  for (let n = 1; n <= CLINICS; n++) {
    const clinic = await Clinic.create({ name: `Group clinic ${n}`, slug: `scale-${String(n).padStart(2, "0")}`, timeZone: ZONE, address: `${n} Bench Row`, phone: null, settings: {} });
    await seedCatalogue(clinic.id);
    clinics.push(clinic);
  }
  const script = `
    CREATE TEMP TABLE sc AS SELECT id, row_number() OVER (ORDER BY slug) AS n FROM clinics WHERE slug LIKE 'scale-%';

    INSERT INTO equipment (clinic_id, kind, name)
      SELECT c.id, k.kind, k.name FROM sc c CROSS JOIN (VALUES ('chair', 'Chair 1'), ('chair', 'Chair 2'), ('chair', 'Chair 3'),
        ('mill', 'Mill 1'), ('mill', 'Mill 2'), ('furnace', 'Furnace 1')) AS k(kind, name);
    INSERT INTO opening_hours (clinic_id, weekday, opens, closes)
      SELECT c.id, w, '07:00', '21:00' FROM sc c CROSS JOIN generate_series(0, 6) AS w;
    INSERT INTO users (email, name, role, clinic_id)
      SELECT 'scale-dentist-' || c.n || '-' || d || '@bench.example', 'Group dentist ' || c.n || '.' || d, 'dentist', c.id
        FROM sc c CROSS JOIN generate_series(0, ${CHAIRS - 1}) AS d;
    INSERT INTO users (email, name, role, clinic_id)
      SELECT 'scale-reception-' || c.n || '@bench.example', 'Group reception ' || c.n, 'reception', c.id FROM sc c;

    -- Invented names, some with letters the search folds (ë, é, ø, ł).
    INSERT INTO users (email, name, role, clinic_id)
      SELECT 'scale-p' || c.n || '-' || i || '@bench.example',
             (ARRAY['Zoë','Noé','Élise','Anaïs','Bjørn','Łucja','Tomás','Inès','Karin','Dario','Mireille','Oskar','Yara','Céline','Pavel','Ruth','Soren','Hélène','Idris','Maëlle'])[1 + i % 20]
             || ' ' || (ARRAY['Halvorsen','Brisebois','Quintal','Nakashima','Ødegård','Varennes','Lafrenière','Okonkwo','Marchetti','Delacroix','Ferreira','Lindqvist','Abernethy','Côté','Wójcik','Tremblay-Ng','Sørlie','Ibarra','Gauthier','Renfrew'])[1 + (i / 20) % 20]
             || ' ' || i,
             'patient', c.id
        FROM sc c CROSS JOIN generate_series(0, ${PATIENTS / CLINICS - 1}) AS i;
    INSERT INTO patients (user_id, clinic_id, date_of_birth, phone)
      SELECT u.id, u.clinic_id, date '1940-01-01' + (abs(hashtext(u.email)) % 25000),
             CASE WHEN abs(hashtext(u.email)) % 7 = 0 THEN NULL ELSE '+1613555' || lpad((abs(hashtext(u.email)) % 10000)::text, 4, '0') END
        FROM users u JOIN sc c ON c.id = u.clinic_id WHERE u.role = 'patient';

    CREATE TEMP TABLE sp AS SELECT id, clinic_id, row_number() OVER (PARTITION BY clinic_id ORDER BY id) - 1 AS k FROM patients WHERE clinic_id IN (SELECT id FROM sc);
    CREATE INDEX ON sp (clinic_id, k);
    CREATE TEMP TABLE se AS SELECT id, clinic_id, kind, row_number() OVER (PARTITION BY clinic_id, kind ORDER BY name) - 1 AS k FROM equipment WHERE clinic_id IN (SELECT id FROM sc);
    CREATE TEMP TABLE sd AS SELECT id, clinic_id, row_number() OVER (PARTITION BY clinic_id ORDER BY email) - 1 AS k FROM users WHERE role = 'dentist' AND clinic_id IN (SELECT id FROM sc);

    -- The visit grid: visit i of a clinic sits on chair i % 3, hour slot (i / 3) % 10, day (i / 30) from ${PAST_DAYS} days ago.
    CREATE TEMP TABLE sv AS
      SELECT gen_random_uuid() AS id, gen_random_uuid() AS proposal_id, c.id AS clinic_id, g.i, g.i % ${CHAIRS} AS chair,
             ((date_trunc('day', now() AT TIME ZONE '${ZONE}') + make_interval(days => g.i / ${SLOTS_A_DAY * CHAIRS} - ${PAST_DAYS},
               hours => 7 + (g.i / ${CHAIRS}) % ${SLOTS_A_DAY}, mins => 20 * (g.i % ${CHAIRS}))) AT TIME ZONE '${ZONE}') AS starts_at,
             sp.id AS patient_id, sd.id AS dentist_id, ch.id AS chair_id, mi.id AS mill_id, m.id AS material_id
        FROM sc c CROSS JOIN generate_series(0, ${PER_CLINIC - 1}) AS g(i)
        JOIN sp ON sp.clinic_id = c.id AND sp.k = g.i % ${PATIENTS / CLINICS}
        JOIN sd ON sd.clinic_id = c.id AND sd.k = g.i % ${CHAIRS}
        JOIN se ch ON ch.clinic_id = c.id AND ch.kind = 'chair' AND ch.k = g.i % ${CHAIRS}
        JOIN se mi ON mi.clinic_id = c.id AND mi.kind = 'mill' AND mi.k = (g.i % ${CHAIRS}) % 2
        JOIN materials m ON m.clinic_id = c.id AND m.key = 'zirconia';
    INSERT INTO proposals (id, clinic_id, patient_id, dentist_id, tooth, fee_cents, status)
      SELECT proposal_id, clinic_id, patient_id, dentist_id, (ARRAY[16, 26, 36, 46, 14, 24])[1 + i % 6], 120000,
             CASE WHEN starts_at < now() THEN 'closed' ELSE 'open' END FROM sv;
    INSERT INTO proposal_materials (proposal_id, material_id, modes) SELECT proposal_id, material_id, ARRAY['standard'] FROM sv;
    INSERT INTO appointments (id, clinic_id, proposal_id, patient_id, dentist_id, material_id, mode, tooth, status, starts_at, ends_at, chair_id, mill_id, fee_cents)
      SELECT id, clinic_id, proposal_id, patient_id, dentist_id, material_id, 'standard', (ARRAY[16, 26, 36, 46, 14, 24])[1 + i % 6], 'confirmed',
             starts_at, starts_at + interval '60 minutes', chair_id, mill_id, 120000 FROM sv;
    INSERT INTO appointment_stages (appointment_id, seq, key, planned_start, planned_end, equipment)
      SELECT id, s.seq, s.key, starts_at + s.a * interval '1 minute', starts_at + s.b * interval '1 minute', s.eq
        FROM sv CROSS JOIN (VALUES (1, 'preparation', 0, 20, ARRAY['chair', 'dentist']), (2, 'fabrication', 20, 40, ARRAY['mill']),
          (3, 'cementation', 40, 60, ARRAY['chair', 'dentist'])) AS s(seq, key, a, b, eq);
    INSERT INTO reservations (appointment_id, clinic_id, resource_kind, resource_id, stage, during)
      SELECT id, clinic_id, 'chair', chair_id, 'visit', tstzrange(starts_at, starts_at + interval '60 minutes') FROM sv
      UNION ALL SELECT id, clinic_id, 'dentist', dentist_id, 'visit', tstzrange(starts_at, starts_at + interval '60 minutes') FROM sv
      UNION ALL SELECT id, clinic_id, 'mill', mill_id, 'fabrication', tstzrange(starts_at + interval '20 minutes', starts_at + interval '40 minutes') FROM sv;

    -- Consents: reviewed for past visits (then those visits are completed, as the database demands),
    -- signed for today's, pending for the next fortnight's.
    INSERT INTO consent_templates (clinic_id, version, title, sections) SELECT id, 1, 'Crown consent', '[]'::jsonb FROM sc;
    INSERT INTO consents (clinic_id, appointment_id, patient_id, status, template_id, template_version, answers, acknowledged,
                          electronic_records_version, consent_text, text_sha256, typed_name, signature_png, signed_at, reviewed_at, reviewed_by)
      SELECT sv.clinic_id, sv.id, sv.patient_id, CASE WHEN sv.starts_at < date_trunc('day', now() AT TIME ZONE '${ZONE}') AT TIME ZONE '${ZONE}' THEN 'reviewed' ELSE 'signed' END,
             t.id, 1, '{}'::jsonb, '{}', '1', 'Bench consent text', encode(sha256('Bench consent text'), 'hex'), 'Bench patient', '\\x89504e47'::bytea,
             sv.starts_at - interval '1 hour',
             CASE WHEN sv.starts_at < date_trunc('day', now() AT TIME ZONE '${ZONE}') AT TIME ZONE '${ZONE}' THEN sv.starts_at - interval '30 minutes' END,
             CASE WHEN sv.starts_at < date_trunc('day', now() AT TIME ZONE '${ZONE}') AT TIME ZONE '${ZONE}' THEN sv.dentist_id END
        FROM sv JOIN consent_templates t ON t.clinic_id = sv.clinic_id
       WHERE sv.starts_at < (date_trunc('day', now() AT TIME ZONE '${ZONE}') + interval '1 day') AT TIME ZONE '${ZONE}';
    INSERT INTO consents (clinic_id, appointment_id, patient_id)
      SELECT clinic_id, id, patient_id FROM sv
       WHERE starts_at >= (date_trunc('day', now() AT TIME ZONE '${ZONE}') + interval '1 day') AT TIME ZONE '${ZONE}'
         AND starts_at < (date_trunc('day', now() AT TIME ZONE '${ZONE}') + interval '15 days') AT TIME ZONE '${ZONE}';
    UPDATE appointments SET status = 'completed'
     WHERE id IN (SELECT id FROM sv WHERE starts_at < date_trunc('day', now() AT TIME ZONE '${ZONE}') AT TIME ZONE '${ZONE}');

    DROP TABLE sv, sp, se, sd, sc;
  `;
  // One transaction on one connection (the temporary tables); statements one by one so a slow one
  // shows. The plain indexes of the large tables are built once after the load rather than row by
  // row during it; unique indexes and constraints stay, so every guarantee is checked as it would be.
  await sequelize.transaction(async (transaction) => {
    const plain = await sequelize.query<{ name: string; def: string }>(
      `SELECT i.indexrelid::regclass::text AS name, pg_get_indexdef(i.indexrelid) AS def
         FROM pg_index i JOIN pg_class t ON t.oid = i.indrelid
        WHERE t.relname IN (:tables) AND NOT i.indisunique AND NOT EXISTS (SELECT 1 FROM pg_constraint c WHERE c.conindid = i.indexrelid)`,
      { replacements: { tables: BIG }, type: QueryTypes.SELECT, transaction },
    );
    for (const index of plain) await sequelize.query(`DROP INDEX ${index.name}`, { transaction });
    for (const statement of script.split(/;\s*\n/).map((x) => x.trim()).filter((x) => x && !/^--[^\n]*$/.test(x))) {
      const t = performance.now();
      await sequelize.query(statement, { transaction });
      const took = performance.now() - t;
      if (took > 5000) console.log(`  seeding: ${ms(took)} for ${statement.replace(/^(--[^\n]*\n\s*)+/, "").slice(0, 60)}…`);
    }
    const t = performance.now();
    for (const index of plain) await sequelize.query(index.def, { transaction });
    console.log(`  seeding: ${ms(performance.now() - t)} to build ${plain.length} indexes after the load`);
  });
  // Once, as autovacuum would soon after such a load in production.
  await sequelize.query("ANALYZE");
  return performance.now() - t0;
}

type Captured = { sql: string; bind?: unknown[]; replacements?: unknown };

/** Times `fn` over rounds and collects the SQL of its first call for EXPLAIN. */
async function measure(fn: (round: number) => Promise<unknown>, rounds: number) {
  const captured: Captured[] = [];
  const query = sequelize.query;
  sequelize.query = ((sql: string | { query: string }, opts?: { bind?: unknown[]; replacements?: unknown }) => {
    captured.push({ sql: typeof sql === "string" ? sql : sql.query, bind: opts?.bind, replacements: opts?.replacements });
    return query.call(sequelize, sql as string, opts as never);
  }) as typeof sequelize.query;
  try {
    await fn(0);
  } finally {
    sequelize.query = query;
  }
  for (let i = 0; i < 3; i++) await fn(i); // warm-up
  const samples: number[] = [];
  for (let i = 0; i < rounds; i++) {
    const t = performance.now();
    await fn(i);
    samples.push(performance.now() - t);
  }
  return { ...stats(samples), p50: stats(samples).median, captured };
}


/** The plan of the slowest captured SELECT: its top lines, and any sequential scan of a large table. */
async function explain(captured: Captured[]) {
  let worst = { ms: -1, plan: [] as string[] };
  for (const q of captured) {
    if (!/^\s*(SELECT|WITH)/i.test(q.sql)) continue;
    const rows = await sequelize.query<{ "QUERY PLAN": string }>(`EXPLAIN (ANALYZE, BUFFERS) ${q.sql.replace(/;\s*$/, "")}`, {
      bind: q.bind, replacements: q.replacements as Record<string, unknown> | undefined, type: QueryTypes.SELECT,
    });
    const plan = rows.map((r) => r["QUERY PLAN"]);
    const took = Number(/Execution Time: ([\d.]+)/.exec(plan.join("\n"))?.[1] ?? 0);
    if (took > worst.ms) worst = { ms: took, plan };
  }
  const seqScans = captured.length
    ? [...new Set(worst.plan.flatMap((l) => /Seq Scan on (\w+)/.exec(l)?.[1] ?? []).filter((t) => BIG.includes(t)))]
    : [];
  return { ...worst, seqScans };
}

function verdict(s: { p50: number; p95: number }) {
  return s.p50 <= TARGET.p50 && s.p95 <= TARGET.p95 ? "within target" : "OVER TARGET";
}

export async function run(): Promise<Record<string, string | number>> {
  await ensureDatabase(new URL(process.env.DATABASE_URL!).pathname.slice(1));
  runCommand(`${root}/node_modules/.bin/tsx`, ["db/migrate.ts", "up"], process.env);
  // The data functions are meant for React Server Components; here, as in Vitest, `server-only` is a no-op.
  const require = createRequire(import.meta.url);
  require.cache[require.resolve("server-only")] = { exports: {} } as NodeJS.Module;

  const have = await count(`SELECT count(*) AS n FROM appointments a JOIN clinics c ON c.id = a.clinic_id WHERE c.slug LIKE 'scale-%'`);
  let seeded = "reused";
  if (have !== VISITS) {
    if (have) throw new Error(`The bench database holds ${have} group visits, not ${VISITS}: drop cuspal_bench and run again.`);
    seeded = ms(await seed());
  }
  const figures: Record<string, string | number> = {
    clinics: await count(`SELECT count(*) AS n FROM clinics WHERE slug LIKE 'scale-%'`),
    patients: await count(`SELECT count(*) AS n FROM patients p JOIN clinics c ON c.id = p.clinic_id WHERE c.slug LIKE 'scale-%'`),
    visits: await count(`SELECT count(*) AS n FROM appointments a JOIN clinics c ON c.id = a.clinic_id WHERE c.slug LIKE 'scale-%'`),
    reservations: await count(`SELECT count(*) AS n FROM reservations r JOIN clinics c ON c.id = r.clinic_id WHERE c.slug LIKE 'scale-%'`),
    consents: await count(`SELECT count(*) AS n FROM consents k JOIN clinics c ON c.id = k.clinic_id WHERE c.slug LIKE 'scale-%'`),
    "seeding time": seeded,
  };

  const clinics = await Clinic.findAll({ where: { slug: Array.from({ length: CLINICS }, (_, i) => `scale-${String(i + 1).padStart(2, "0")}`) }, order: [["slug", "ASC"]] });
  const reception = await User.findAll({ where: { role: "reception", clinicId: clinics.map((c) => c.id) } });
  const staffOf = (clinicId: string) => {
    const u = reception.find((r) => r.clinicId === clinicId)!;
    return { id: u.id, email: u.email, name: u.name, role: "reception" as const, clinicId };
  };
  const now = new Date();
  const today = localDate(now, ZONE);
  const { loadBoard } = await import("@/lib/data/board");
  const { searchPatients } = await import("@/lib/data/patients");
  const { listConsents } = await import("@/lib/data/consents");
  const { searchSlots } = await import("@/lib/booking/search");

  // One open proposal per clinic for availability: zirconia, standard mode, its chair's dentist.
  const proposals: { proposal: Proposal; materialId: string }[] = [];
  for (const clinic of clinics) {
    const zr = (await Material.findOne({ where: { clinicId: clinic.id, key: "zirconia" } }))!;
    const p = (await Proposal.findOne({ where: { clinicId: clinic.id, status: "open" }, order: [["createdAt", "ASC"]] }))!;
    if (!(await ProposalMaterial.findOne({ where: { proposalId: p.id, materialId: zr.id } }))) await ProposalMaterial.create({ proposalId: p.id, materialId: zr.id, modes: ["standard"] });
    proposals.push({ proposal: p, materialId: zr.id });
  }

  // Where each clinic's 40th page of 50 starts: keyset paging should cost the same there as on the first.
  const deepCursor: string[] = [];
  for (const clinic of clinics) {
    let cursor: string | null = null;
    for (let page = 1; page < 40; page++) cursor = (await listConsents({ user: staffOf(clinic.id), cursor })).nextCursor;
    deepCursor.push(cursor!);
  }

  const queries = ["zoe", "lafreniere", "odegard 12", "Hélène Côté", "scale-p3-42", "6135550142", "1975-03-04", "tremblay-ng 99"];
  const cases: { name: string; fn: (i: number) => Promise<unknown> }[] = [
    { name: "day board (today, one clinic)", fn: (i) => loadBoard({ clinicId: clinics[i % CLINICS].id, day: today, now }) },
    { name: "day board (a past day)", fn: (i) => loadBoard({ clinicId: clinics[i % CLINICS].id, day: addDays(today, -1 - (i % 60)), now }) },
    { name: "patient search", fn: (i) => searchPatients({ user: staffOf(clinics[i % CLINICS].id), q: queries[i % queries.length], page: 1 + (i % 2) }) },
    { name: "availability (14 days)", fn: (i) => searchSlots({ ...proposals[i % CLINICS], mode: "standard", from: addDays(today, 1), days: 14, now }) },
    { name: "consent list (signed, to review)", fn: (i) => listConsents({ user: staffOf(clinics[i % CLINICS].id), status: "signed" }) },
    { name: "consent list (a clinic's first page)", fn: (i) => listConsents({ user: staffOf(clinics[i % CLINICS].id) }) },
    { name: "consent list (a clinic's 40th page)", fn: (i) => listConsents({ user: staffOf(clinics[i % CLINICS].id), cursor: deepCursor[i % CLINICS] }) },
  ];
  const slotsFound = (await searchSlots({ ...proposals[0], mode: "standard", from: addDays(today, 1), days: 14, now })).slots.length;
  const boardVisits = (await loadBoard({ clinicId: clinics[0].id, day: today, now })).visits.length;
  figures["visits on today's board (clinic 1)"] = boardVisits;
  figures["availability: slots found (clinic 1, 14 days)"] = slotsFound;

  const plans: string[] = [];
  for (const c of cases) {
    const r = await measure(c.fn, 40);
    figures[`${c.name}: p50 (target ≤ ${TARGET.p50} ms)`] = ms(r.p50);
    figures[`${c.name}: p95 (target ≤ ${TARGET.p95} ms)`] = `${ms(r.p95)}  ${verdict(r)}`;
    const plan = await explain(r.captured);
    figures[`${c.name}: sequential scans of large tables`] = plan.seqScans.length ? plan.seqScans.join(", ") : "none";
    // The top of the plan, then every table access below it (which index, or a sequential scan).
    const scans = plan.plan.slice(4).filter((l) => /Scan/.test(l)).map((l) => l.trim());
    const lines = [...plan.plan.slice(0, 4), ...(scans.length ? ["…table accesses:", ...scans] : [])].map((l) => (l.length > 170 ? `${l.slice(0, 170)}…` : l));
    plans.push(`\n${c.name}: slowest query's plan (${plan.ms.toFixed(1)} ms in EXPLAIN ANALYZE)\n  ${lines.join("\n  ")}`);
  }
  console.log(plans.join("\n"));
  return figures;
}
