// The route × role matrix: every method of every API route, called as each kind of caller against
// the real database, answers the status its row in tests/support/route-matrix.ts says.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { apiRouteFiles } from "../support/api-routes";
import { ROUTE_MATRIX, rowBody, rowKey, rowQuery, type Fill, type Ids, type MatrixRow } from "../support/route-matrix";
import { signInAs } from "../support/session";
import { ACTORS, actAs, apiRequest, createWorld, type World } from "../support/trust-world";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

let world: World;
beforeAll(async () => {
  world = await createWorld();
}, 120_000);

type Handler = (req: Request, ctx: { params: Promise<Ids> }) => Promise<Response>;

async function handlerFor(row: MatrixRow): Promise<Handler> {
  const file = apiRouteFiles().find((f) => f.route === row.route)!.file;
  const mod = (await import(/* @vite-ignore */ file)) as Record<string, Handler>;
  return mod[row.method];
}

async function fill(f: Fill, w: World): Promise<string> {
  if (typeof f === "object") return f.literal;
  switch (f) {
    case "visit": return (await w.make.visit("confirmed")).id;
    case "requestedVisit": return (await w.make.visit("requested")).id;
    case "consent": return w.make.consent();
    case "document": return w.make.document();
    case "outage": return w.make.outage();
    case "proposal": return w.proposal.id;
    case "token": return w.make.token();
    case "ownerPatient": return w.owner.patient.id;
    case "patient": return w.make.patient();
    case "staffMember": return w.make.staffMember();
    // Payments
    case "dueDepositVisit": return w.money.dueDepositVisit();
    case "paidDepositVisit": return w.money.paidDepositVisit();
  }
}

/** Builds the row's request with freshly made rows, then calls its handler. */
async function callRow(row: MatrixRow, w: World): Promise<Response> {
  const ids: Ids = {};
  for (const [name, f] of Object.entries(row.params ?? {})) ids[name] = await fill(f, w);
  let path = row.route.replace(/\[([^\]]+)\]/g, (_, name: string) => encodeURIComponent(ids[name]));
  path += rowQuery(row, w);
  const handler = await handlerFor(row);
  return handler(apiRequest(row.method, path, rowBody(row, w, ids)), { params: Promise.resolve(ids) });
}

describe("route × role matrix", () => {
  it("has exactly one row for every method every route file exports", () => {
    const exported = apiRouteFiles().flatMap((f) => f.methods.map((m) => rowKey(m, f.route)));
    const rows = ROUTE_MATRIX.map((r) => rowKey(r.method, r.route));
    expect(new Set(rows).size, "a route and method listed twice").toBe(rows.length);
    expect(exported.filter((k) => !rows.includes(k)), "route methods without a row in tests/support/route-matrix.ts").toEqual([]);
    expect(rows.filter((k) => !exported.includes(k)), "rows for routes that no longer exist").toEqual([]);
  });

  for (const row of ROUTE_MATRIX.filter((r) => !r.expect.startsWith("skip"))) {
    it(`${row.method} ${row.route}`, async () => {
      const want = row.expect.trim().split(/\s+/).map(Number);
      expect(want, "seven statuses, one per caller").toHaveLength(ACTORS.length);
      const got: Record<string, number> = {};
      for (const actor of ACTORS) {
        actAs(world, actor);
        const res = await callRow(row, world);
        got[actor] = res.status;
        // Every answer is JSON `{ error }` when refused, and never kept by a cache.
        if (res.status >= 400) expect(await res.json(), `${actor}: error body`).toEqual(expect.objectContaining({ error: expect.any(String) }));
        else await res.arrayBuffer();
        expect(res.headers.get("cache-control") ?? "", `${actor}: cache-control`).toMatch(/no-store/);
      }
      expect(got).toEqual(Object.fromEntries(ACTORS.map((a, i) => [a, want[i]])));
    });
  }

  // The walk's foreign caller is reception, refused by role (403) before any row is looked up. A
  // manager of the other clinic passes the role check, so the row lookup must answer 404.
  it("another clinic's manager gets 404 for a staff account or patient of this clinic", async () => {
    signInAs(world.away.staff.admin);
    const byRow = (method: MatrixRow["method"], route: string) => ROUTE_MATRIX.find((r) => r.method === method && r.route === route)!;
    const got: Record<string, number> = {};
    for (const row of [byRow("PATCH", "/api/staff/[id]"), byRow("GET", "/api/patients/[id]"), byRow("PATCH", "/api/patients/[id]"), byRow("POST", "/api/patients/[id]/invite")]) {
      const res = await callRow(row, world);
      got[`${row.method} ${row.route}`] = res.status;
      expect(await res.json()).toEqual(expect.objectContaining({ error: expect.any(String) }));
    }
    expect(got).toEqual({
      "PATCH /api/staff/[id]": 404, "GET /api/patients/[id]": 404, "PATCH /api/patients/[id]": 404, "POST /api/patients/[id]/invite": 404,
    });
  });
});
