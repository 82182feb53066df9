// Availability over 14 days at a clinic with 3 chairs, 2 mills, 1 furnace and 300 existing visits,
// and 50 concurrent bookings of the same slot through the HTTP API. Each figure is printed beside
// its target.
import { performance } from "node:perf_hooks";
import { Appointment, Clinic, Equipment, Material, OpeningHour, Patient, Proposal, ProposalMaterial, User, sequelize } from "@/db/models";
import { seedCatalogue } from "@/db/seed/demo-clinic";
import { loadBusy, loadResources, loadRules, loadTimeline } from "@/lib/booking/context";
import { writeSchedule } from "@/lib/booking/schedule";
import { searchSlots } from "@/lib/booking/search";
import { findSlots } from "@/lib/domain/availability";
import { addDays, localDate, zonedTime } from "@/lib/domain/time-zone";
import { benchEnv, freshDatabase, ms, run, serverCpuMs, serverMemory, sessionCookie, startApp, stats, stopApp, throughput } from "./support";

const DB = "cuspal_bench";
// CUSPAL_TEST_PORT_OFFSET moves the port, as it does for `npm test`.
const PORT = 3290 + Number(process.env.CUSPAL_TEST_PORT_OFFSET ?? 0);
const MIN = 60_000;

async function seedBenchClinic() {
  const clinic = await Clinic.create({ name: "Bench clinic", slug: "bench", timeZone: "America/Toronto", address: "1 Bench Row", phone: null, settings: { minNoticeMinutes: 0 } });
  await seedCatalogue(clinic.id);
  await OpeningHour.bulkCreate([1, 2, 3, 4, 5, 6].flatMap((weekday) => [
    { clinicId: clinic.id, weekday, opens: "07:00", closes: "12:30" },
    { clinicId: clinic.id, weekday, opens: "13:00", closes: "20:00" },
  ]));
  await Equipment.bulkCreate([
    ...["Chair 1", "Chair 2", "Chair 3"].map((name) => ({ clinicId: clinic.id, kind: "chair" as const, name })),
    { clinicId: clinic.id, kind: "mill", name: "Mill A" }, { clinicId: clinic.id, kind: "mill", name: "Mill B" },
    { clinicId: clinic.id, kind: "furnace", name: "Furnace 1" },
  ]);
  const dentists = await Promise.all(Array.from({ length: 4 }, (_, i) => User.create({ email: `bench-dentist-${i}@cuspal.test`, name: `Bench dentist ${i}`, role: "dentist", clinicId: clinic.id, passwordHash: null, emailVerified: null })));
  const zr = (await Material.findOne({ where: { clinicId: clinic.id, key: "zirconia" } }))!;
  const feld = (await Material.findOne({ where: { clinicId: clinic.id, key: "feldspathic-ceramic" } }))!;
  return { clinic, dentists, zr, feld };
}

async function makePatient(clinicId: string, i: number) {
  const user = await User.create({ email: `bench-patient-${i}@cuspal.test`, name: `Bench patient ${i}`, role: "patient", clinicId, passwordHash: null, emailVerified: null });
  const patient = await Patient.create({ userId: user.id, clinicId, dateOfBirth: null, phone: null });
  return { user, patient };
}

export async function run300(): Promise<Record<string, string | number>> {
  const env = benchEnv(DB, PORT);
  await freshDatabase(DB);
  Object.assign(process.env, { DATABASE_URL: env.DATABASE_URL });
  run(`${process.cwd()}/node_modules/.bin/tsx`, ["db/migrate.ts", "up"], env);

  const { clinic, dentists, zr, feld } = await seedBenchClinic();
  const now = new Date();
  const from = addDays(localDate(now, clinic.timeZone), 1);

  // 300 visits over the coming weeks, alternating dentists and materials.
  let placed = 0;
  for (let i = 0; placed < 300 && i < 2000; i++) {
    const dentist = dentists[i % dentists.length];
    const material = i % 3 === 0 ? feld : zr;
    const { patient } = await makePatient(clinic.id, i);
    const proposal = await Proposal.create({ clinicId: clinic.id, patientId: patient.id, dentistId: dentist.id, tooth: 36 - (i % 2) * 21, feeCents: 100000, note: null });
    await ProposalMaterial.create({ proposalId: proposal.id, materialId: material.id, modes: ["rapid"] });
    const { timeline } = await loadTimeline({ clinicId: clinic.id, materialId: material.id, mode: "rapid", tooth: proposal.tooth });
    const rules = await loadRules(clinic);
    const resources = await loadResources(clinic.id, dentist.id);
    // One dentist's hands-on windows and one furnace limit a day to a handful of crowns, so 300 visits
    // spread over the next ten weeks, one day at a time, on the first free slot of that day.
    const day = addDays(from, i % 72);
    const busy = await loadBusy({ clinicId: clinic.id, resources, from: zonedTime(day, "00:00", clinic.timeZone), to: zonedTime(addDays(day, 1), "00:00", clinic.timeZone) });
    const daySlots = findSlots({ timeline, rules, resources, busy, from: day, days: 1, now });
    const slot = daySlots[0] ?? null;
    if (!slot) continue;
    await sequelize.transaction(async (transaction) => {
      const a = await Appointment.create({
        clinicId: clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: dentist.id, materialId: material.id, mode: "rapid", tooth: proposal.tooth,
        status: "confirmed", startsAt: slot.start, endsAt: new Date(slot.start.getTime() + timeline.totalMinutes * MIN),
        chairId: slot.assignment.chair!, millId: slot.assignment.mill!, furnaceId: slot.assignment.furnace, feeCents: 100000, createdBy: null,
      }, { transaction });
      await writeSchedule({ appointment: a, timeline, start: slot.start, assignment: slot.assignment, bufferMinutes: rules.bufferMinutes, transaction });
    });
    placed++;
  }

  // The measured proposal: zirconia standard for a molar with the first dentist.
  const { user: benchUser, patient } = await makePatient(clinic.id, 9999);
  const proposal = await Proposal.create({ clinicId: clinic.id, patientId: patient.id, dentistId: dentists[0].id, tooth: 36, feeCents: 100000, note: null });
  await ProposalMaterial.create({ proposalId: proposal.id, materialId: zr.id, modes: ["standard"] });

  const compute: number[] = [];
  const pure: number[] = [];
  let slotCount = 0;
  const { timeline } = await loadTimeline({ clinicId: clinic.id, materialId: zr.id, mode: "standard", tooth: 36 });
  const rules = await loadRules(clinic);
  const resources = await loadResources(clinic.id, dentists[0].id);
  const busy = await loadBusy({ clinicId: clinic.id, resources, from: zonedTime(from, "00:00", clinic.timeZone), to: zonedTime(addDays(from, 15), "00:00", clinic.timeZone) });
  for (let i = 0; i < 30; i++) {
    let t = performance.now();
    const r = await searchSlots({ proposal, materialId: zr.id, mode: "standard", from, days: 14, now });
    compute.push(performance.now() - t);
    slotCount = r.slots.length;
    t = performance.now();
    findSlots({ timeline, rules, resources, busy, from, days: 14, now });
    pure.push(performance.now() - t);
  }

  // Through the route handler, over HTTP, against `next start`.
  const app = await startApp(env, PORT);
  try {
    const cookie = await sessionCookie({ id: benchUser.id, email: benchUser.email, name: benchUser.name, role: "patient", clinicId: clinic.id, sessionVersion: benchUser.sessionVersion }, env.NEXTAUTH_SECRET!);
    const availabilityUrl = `http://localhost:${PORT}/api/proposals/${proposal.id}/availability?materialId=${zr.id}&mode=standard&from=${from}&days=14`;
    const http: number[] = [];
    for (let i = 0; i < 60; i++) {
      const t = performance.now();
      const res = await fetch(availabilityUrl, { headers: { cookie } });
      await res.json();
      if (!res.ok) throw new Error(`availability returned ${res.status}`);
      // The first requests warm the server up (code loading, connections).
      if (i >= 10) http.push(performance.now() - t);
    }

    // Side by side under 10 concurrent callers: the liveness route (no database) and availability.
    // The server's CPU per request beside each rate: the load generator shares the machine's cores.
    let cpu0 = serverCpuMs(app);
    const liveRate = await throughput(`http://localhost:${PORT}/api/health/live`, {}, 10, 5);
    const liveCpu = (serverCpuMs(app) - cpu0) / (liveRate * 5);
    cpu0 = serverCpuMs(app);
    const availabilityRate = await throughput(availabilityUrl, { headers: { cookie } }, 10, 5);
    const availabilityCpu = (serverCpuMs(app) - cpu0) / (availabilityRate * 5);
    const memoryAfterLoad = serverMemory(app)[0]?.rssMb ?? NaN;

    // 50 patients, each with a proposal, all asking for the same start at once (and 50 more for the
    // same race split over two instances).
    const racers: { cookie: string; proposalId: string }[] = [];
    for (let i = 0; i < 100; i++) {
      const { user, patient: p } = await makePatient(clinic.id, 10_000 + i);
      const prop = await Proposal.create({ clinicId: clinic.id, patientId: p.id, dentistId: dentists[1].id, tooth: 11, feeCents: 100000, note: null });
      await ProposalMaterial.create({ proposalId: prop.id, materialId: feld.id, modes: ["rapid"] });
      racers.push({ cookie: await sessionCookie({ id: user.id, email: user.email, name: user.name, role: "patient", clinicId: clinic.id, sessionVersion: user.sessionVersion }, env.NEXTAUTH_SECRET!), proposalId: prop.id });
    }
    const free = await (await fetch(`http://localhost:${PORT}/api/proposals/${racers[0].proposalId}/availability?materialId=${feld.id}&mode=rapid&from=${from}&days=60`, { headers: { cookie: racers[0].cookie } })).json();
    if (!free.slots?.length) throw new Error("No free slot left for the concurrency run.");
    const start = free.slots[0].start;
    // A running instance has its booking route loaded: warm it (a refused request loads the code, as
    // the first availability requests above do) so the race measures bookings, not code loading.
    const warmBookings = async (port: number, racer: (typeof racers)[number]) => {
      for (let i = 0; i < 3; i++) {
        const warm = await fetch(`http://localhost:${port}/api/appointments`, { method: "POST", headers: { cookie: racer.cookie, "content-type": "application/json" }, body: JSON.stringify({ proposalId: racer.proposalId, materialId: feld.id, mode: "rapid", start: "2000-01-01T09:00:00Z" }) });
        if (warm.status !== 400) throw new Error(`warm-up booking answered ${warm.status}, expected 400 (a past time)`);
      }
    };
    await warmBookings(PORT, racers[0]);
    const race = async (who: typeof racers, ports: number[], at: string) => {
      const latencies: number[] = [];
      const statuses = await Promise.all(who.map(async (r, i) => {
        const t = performance.now();
        const res = await fetch(`http://localhost:${ports[i % ports.length]}/api/appointments`, { method: "POST", headers: { cookie: r.cookie, "content-type": "application/json" }, body: JSON.stringify({ proposalId: r.proposalId, materialId: feld.id, mode: "rapid", start: at }) });
        await res.text();
        latencies.push(performance.now() - t);
        return res.status;
      }));
      return { statuses, latencies };
    };
    const raceCpu0 = serverCpuMs(app);
    const { statuses, latencies } = await race(racers.slice(0, 50), [PORT], start);
    const raceCpu = (serverCpuMs(app) - raceCpu0) / 50;
    const count = (s: number) => statuses.filter((x) => x === s).length;
    const s = stats(latencies);
    const memoryAfterRace = serverMemory(app)[0]?.rssMb ?? NaN;

    // The same race for another free time, its 50 requests split over two instances on one database.
    const second = await startApp(env, PORT + 1);
    let split: { statuses: number[]; latencies: number[] };
    try {
      const later = await (await fetch(`http://localhost:${PORT}/api/proposals/${racers[50].proposalId}/availability?materialId=${feld.id}&mode=rapid&from=${addDays(from, 1)}&days=60`, { headers: { cookie: racers[50].cookie } })).json();
      if (!later.slots?.length) throw new Error("No free slot left for the two-instance run.");
      for (const port of [PORT, PORT + 1]) await warmBookings(port, racers[50]);
      split = await race(racers.slice(50), [PORT, PORT + 1], later.slots[0].start);
    } finally {
      stopApp(second);
    }
    const splitCount = (st: number) => split.statuses.filter((x) => x === st).length;
    const mb = (n: number) => `${n.toFixed(0)} MB`;
    return {
      "existing visits": placed,
      "availability: slots found (14 days)": slotCount,
      "availability: DB load + compute, median": ms(stats(compute).median),
      "availability: DB load + compute, p95": ms(stats(compute).p95),
      "availability: pure computation, median": ms(stats(pure).median),
      "availability: full HTTP request, median": `${ms(stats(http).median)} (target ≤ 15 ms)`,
      "availability: full HTTP request, p95": ms(stats(http).p95),
      "10 callers: /api/health/live": `${liveRate.toFixed(0)} req/s`,
      "10 callers: availability": `${availabilityRate.toFixed(0)} req/s`,
      "10 callers: availability / live": `${((100 * availabilityRate) / liveRate).toFixed(0)} % (target ≥ 50 %)`,
      "server CPU per request: live / availability": `${ms(liveCpu)} / ${ms(availabilityCpu)}`,
      "50 concurrent bookings: 201": `${count(201)} (target 1)`,
      "50 concurrent bookings: 409": `${count(409)} (target 49)`,
      "50 concurrent bookings: 5xx": `${statuses.filter((x) => x >= 500).length} (target 0)`,
      "50 concurrent bookings: p95 latency": `${ms(s.p95)} (target ≤ 300 ms)`,
      "50 concurrent bookings: max latency": ms(s.max),
      "50 bookings over two instances: 201 / 409 / 5xx": `${splitCount(201)} / ${splitCount(409)} / ${split.statuses.filter((x) => x >= 500).length} (target 1 / 49 / 0)`,
      "50 bookings over two instances: p95 latency": `${ms(stats(split.latencies).p95)} (target ≤ 300 ms)`,
      "50 concurrent bookings: server CPU per booking": ms(raceCpu),
      "app server memory (VmRSS) after the availability load": `${mb(memoryAfterLoad)} (target ≤ 300 MB)`,
      "app server memory (VmRSS) after the bookings": `${mb(memoryAfterRace)} (target ≤ 300 MB)`,
    };
  } finally {
    stopApp(app);
  }
}
