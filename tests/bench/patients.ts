// Staff search over 10,000 patients of one clinic: accent-insensitive name, e-mail, phone digits and
// date of birth, through the same data function the page and the API use. Target: median ≤ 30 ms.
import { performance } from "node:perf_hooks";
import { createRequire } from "node:module";
import pg from "pg";
import { QueryTypes } from "sequelize";
import { Clinic, sequelize } from "@/db/models";
import { ms, run as runCommand, stats } from "./support";

const COUNT = 10_000;
export const TARGET_MEDIAN_MS = 30;

// Invented name parts, some with letters unaccent must fold (ë, é, ø, ł…).
const FIRST = ["Zoë", "Noé", "Élise", "Anaïs", "Bjørn", "Łucja", "Tomás", "Inès", "Karin", "Dario", "Mireille", "Oskar", "Yara", "Céline", "Pavel", "Ruth", "Soren", "Hélène", "Idris", "Maëlle"];
const LAST = ["Halvorsen", "Brisebois", "Quintal", "Nakashima", "Ødegård", "Varennes", "Lafrenière", "Okonkwo", "Marchetti", "Delacroix", "Ferreira", "Lindqvist", "Abernethy", "Côté", "Wójcik", "Tremblay-Ng", "Sørlie", "Ibarra", "Gauthier", "Renfrew"];

async function seed(clinicId: string) {
  const emails: string[] = [], names: string[] = [], births: string[] = [], phones: (string | null)[] = [], archived: boolean[] = [];
  for (let i = 0; i < COUNT; i++) {
    const first = FIRST[i % FIRST.length], last = LAST[Math.floor(i / FIRST.length) % LAST.length];
    names.push(`${first} ${last} ${i}`);
    emails.push(`p${i}.${last.normalize("NFD").replace(/\p{M}/gu, "").replace(/[^a-z]/gi, "").toLowerCase()}@bench.example`);
    births.push(new Date(Date.UTC(1940 + (i % 70), i % 12, 1 + (i % 28))).toISOString().slice(0, 10));
    // 555-01xx is kept for fiction in North America; area codes vary so the digits differ.
    phones.push(i % 7 === 0 ? null : `+1${[613, 819, 343, 416][i % 4]}5550${String(100 + (i % 100)).slice(1)}`);
    archived.push(i % 25 === 0);
  }
  await sequelize.query(
    `WITH u AS (
       INSERT INTO users (email, name, role, clinic_id, active)
       SELECT e, n, 'patient', $1, NOT a FROM unnest($2::text[], $3::text[], $4::boolean[]) AS t(e, n, a)
       RETURNING id, email, active)
     INSERT INTO patients (user_id, clinic_id, date_of_birth, phone, archived_at)
     SELECT u.id, $1, t.b::date, t.p, CASE WHEN u.active THEN NULL ELSE now() END
       FROM u JOIN unnest($2::text[], $5::text[], $6::text[]) AS t(e, b, p) ON t.e = u.email`,
    { bind: [clinicId, emails, names, archived, births, phones] },
  );
  await sequelize.query("ANALYZE users; ANALYZE patients;");
}

/** Uses the benchmark database as it is (migrating it if needed) and removes its own clinic afterwards. */
export async function run(): Promise<Record<string, string | number>> {
  await ensureDatabase();
  runCommand(`${process.cwd()}/node_modules/.bin/tsx`, ["db/migrate.ts", "up"], process.env);
  const clinic = await Clinic.create({ name: "Bench clinic", slug: `bench-patients-${Date.now()}`, timeZone: "America/Toronto", address: "1 Bench Row", phone: null, settings: {} });
  try {
    await seed(clinic.id);
    return await measure(clinic.id);
  } finally {
    await sequelize.query(`DELETE FROM patients WHERE clinic_id = $1; `, { bind: [clinic.id] });
    await sequelize.query(`DELETE FROM users WHERE clinic_id = $1`, { bind: [clinic.id] });
    await clinic.destroy();
  }
}

async function ensureDatabase() {
  const url = new URL(process.env.DATABASE_URL!);
  const db = url.pathname.slice(1);
  url.pathname = "/postgres";
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  const { rowCount } = await client.query("SELECT 1 FROM pg_database WHERE datname = $1", [db]);
  if (!rowCount) await client.query(`CREATE DATABASE "${db}"`);
  await client.end();
}

async function measure(clinicId: string): Promise<Record<string, string | number>> {
  // The data function is meant for React Server Components; here, as in Vitest, `server-only` is a no-op.
  const require = createRequire(import.meta.url);
  require.cache[require.resolve("server-only")] = { exports: {} } as NodeJS.Module;
  const { searchPatients } = await import("@/lib/data/patients");
  const user = { id: "00000000-0000-0000-0000-000000000000", email: "reception@bench.example", name: "Bench", role: "reception" as const, clinicId };
  const queries = ["zoe", "lafreniere", "odegard 1", "Hélène Côté", "p4242.", "6135550142", "1975-03-04", "tremblay-ng 99"];
  for (const q of queries) await searchPatients({ user, q }); // warm-up
  const samples: number[] = [];
  const perQuery = new Map<string, number[]>(queries.map((q) => [q, []]));
  for (let round = 0; round < 15; round++) {
    for (const q of queries) {
      const t0 = performance.now();
      await searchPatients({ user, q, page: 1 + (round % 3) });
      const took = performance.now() - t0;
      samples.push(took);
      perQuery.get(q)!.push(took);
    }
  }
  const slowest = [...perQuery].map(([q, t]) => [q, stats(t).median] as const).sort((a, b) => b[1] - a[1])[0];
  const found = await searchPatients({ user, q: "zoe" });
  const plan = await sequelize.query<{ "QUERY PLAN": string }>(
    `EXPLAIN SELECT id FROM users WHERE cuspal_person_key(name, email) LIKE lower(cuspal_unaccent('%zoe%'))`,
    { type: QueryTypes.SELECT },
  );
  const planText = plan.map((r) => r["QUERY PLAN"]).join("\n");
  const s = stats(samples);
  return {
    "patients in the clinic": COUNT,
    "\"zoe\" finds (accent-insensitive, archived hidden)": found.total,
    "search: median (target ≤ 30 ms)": `${ms(s.median)}${s.median <= TARGET_MEDIAN_MS ? "" : "  ← over target"}`,
    "search: p95": ms(s.p95),
    "slowest search (median)": `"${slowest[0]}" ${ms(slowest[1])}`,
    "name/e-mail lookup uses": planText.includes("users_person_key_trgm") ? "the trigram index" : "no index (check the plan)",
  };
}
