// Malformed input against every API route and method, as every kind of caller: bogus ids, broken
// JSON, wrong types, impossible dates, huge strings. No answer may be a 5xx, and the database must
// be exactly as before (row counts and checksums of the main tables).
import fc from "fast-check";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { API_OPERATIONS } from "@/lib/server/openapi";
import { apiRouteFiles } from "../support/api-routes";
import { ROUTE_MATRIX, rowBody, rowQuery } from "../support/route-matrix";
import { ACTORS, actAs, apiRequest, createWorld, snapshot, type World } from "../support/trust-world";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

// A few hundred cases in all: each route and method gets this many.
const RUNS_PER_OPERATION = 8;

let world: World;
let before: Record<string, string>;
beforeAll(async () => {
  world = await createWorld();
  // Rows the world makes lazily are made now, so the walk itself has nothing to create.
  await world.make.document();
  before = await snapshot(world);
}, 120_000);

// Near-UUIDs (the right length or layout, the wrong characters) are the ones a loose check lets through.
const nearUuid = fc.oneof(
  fc.constantFrom("-".repeat(36), "9".repeat(36), "00000000-0000-0000-0000-00000000000g"),
  fc.stringMatching(/^[0-9a-f-]{36}$/),
  fc.stringMatching(/^[0-9a-z]{8}-[0-9a-z]{4}-[0-9a-z]{4}-[0-9a-z]{4}-[0-9a-z]{12}$/),
);
const bogusId = fc.oneof(
  { arbitrary: nearUuid, weight: 3 },
  { arbitrary: fc.constantFrom("../../etc/passwd", "%00", "1e309", "0", "-1", "null", " ", "🦷".repeat(9)), weight: 1 },
  { arbitrary: fc.uuid(), weight: 1 },
  { arbitrary: fc.string({ maxLength: 60 }), weight: 1 },
);
const impossibleDate = fc.constantFrom("2099-13-45", "2027-02-30", "2027-02-29", "0000-00-00", "2027-04-31T08:00", "2027-02-30T09:00:00-05:00", "2027-03-15T25:61:00Z", "9999-99-99", "yesterday");
const hugeString = fc.constantFrom("x".repeat(5_000), "é".repeat(40_000), "x".repeat(70_000));
const wrongValue = fc.oneof(
  fc.integer(), fc.double(), fc.boolean(), fc.constant(null), fc.string({ maxLength: 30 }), impossibleDate, bogusId, hugeString,
  fc.array(fc.string({ maxLength: 5 }), { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 5 }), fc.integer(), { maxKeys: 3 }),
);
const brokenJson = fc.constantFrom("{", '{"a":', "nul", "[1,2", '{"tooth": 36,}', "\u0000", '{"__proto__": {"admin": true}}', "1".repeat(400));

/** The route's operation in the API document. */
function operationOf(route: string, method: string) {
  return API_OPERATIONS.find((o) => o.path === route.replace(/\[\.\.\.([^\]]+)\]/g, "{$1}").replace(/\[([^\]]+)\]/g, "{$1}") && o.method === method.toLowerCase());
}

/** The body and query keys a route reads, from the API document, so the fuzz aims at real fields. */
function keysOf(route: string, method: string): { body: string[]; query: string[] } {
  const op = operationOf(route, method);
  const shape = (s: unknown) => Object.keys((s as { shape?: Record<string, unknown> } | undefined)?.shape ?? {});
  return { body: [...shape(op?.json), ...shape(op?.multipart)], query: shape(op?.query) };
}

type Case = { actor: (typeof ACTORS)[number]; aroundValid: boolean; ids: string[]; query: [string, string][]; body: { kind: "json"; value: unknown } | { kind: "raw"; text: string; type: string } | { kind: "form"; fields: [string, string][] } | { kind: "none" } };

function caseFor(keys: { body: string[]; query: string[] }): fc.Arbitrary<Case> {
  const field = keys.body.length ? fc.constantFrom(...keys.body) : fc.string({ maxLength: 8 });
  const queryKey = keys.query.length ? fc.constantFrom(...keys.query) : fc.string({ maxLength: 8 });
  return fc.record({
    actor: fc.constantFrom(...ACTORS),
    // Half the cases send the route's own valid query and body around bogus path ids, so the id
    // itself is what the handler meets first.
    aroundValid: fc.boolean(),
    ids: fc.array(bogusId, { minLength: 3, maxLength: 3 }),
    query: fc.array(fc.tuple(queryKey, fc.oneof(impossibleDate, bogusId, fc.string({ maxLength: 20 }), hugeString.map((s) => s.slice(0, 3000)))), { minLength: 1, maxLength: 3 }),
    body: fc.oneof(
      fc.dictionary(field, wrongValue, { minKeys: 1, maxKeys: 4 }).map((value) => ({ kind: "json" as const, value })),
      fc.anything({ maxDepth: 2 }).map((value) => ({ kind: "json" as const, value })),
      fc.tuple(brokenJson, fc.constantFrom("application/json", "text/plain", "application/x-www-form-urlencoded")).map(([text, type]) => ({ kind: "raw" as const, text, type })),
      fc.array(fc.tuple(field, fc.oneof(fc.string({ maxLength: 20 }), impossibleDate, bogusId)), { maxLength: 4 }).map((fields) => ({ kind: "form" as const, fields })),
      fc.constant({ kind: "none" as const }),
    ),
  });
}

function requestFor(method: string, route: string, c: Case) {
  const row = ROUTE_MATRIX.find((r) => r.method === method && r.route === route);
  const templated = /\[/.test(route);
  let i = 0;
  const params: Record<string, string> = {};
  const path = route.replace(/\[(?:\.\.\.)?([^\]]+)\]/g, (_, name: string) => {
    params[name] = c.ids[i++ % c.ids.length];
    return encodeURIComponent(params[name]);
  });
  if (c.aroundValid && templated && row) {
    return { req: apiRequest(method, path + rowQuery(row, world), rowBody(row, world, params)), params };
  }
  const qs = new URLSearchParams(c.query).toString();
  const url = `${path}?${qs}`;
  const hasBody = method !== "GET";
  const b = c.body;
  let body: unknown;
  let headers: Record<string, string> = {};
  if (hasBody && b.kind === "json") body = JSON.stringify(b.value ?? null);
  else if (hasBody && b.kind === "raw") [body, headers] = [b.text, { "content-type": b.type }];
  else if (hasBody && b.kind === "form") {
    const form = new FormData();
    for (const [k, v] of b.fields) form.append(k, v);
    body = form;
  }
  return { req: apiRequest(method, url, body, headers), params };
}

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

describe("malformed input against every route", () => {
  const routes = apiRouteFiles().filter((r) => !r.route.startsWith("/api/auth/"));

  for (const r of routes) {
    for (const method of r.methods) {
      it(`${method} ${r.route}: never a 5xx`, async () => {
        const handler = ((await import(/* @vite-ignore */ r.file)) as Record<string, Handler>)[method];
        await fc.assert(
          fc.asyncProperty(caseFor(keysOf(r.route, method)), async (c) => {
            // A route whose fields are all optional accepts some generated bodies as they are
            // (`{ "reminders": false }` for PATCH /api/me): that is a valid request, which may
            // rightly change data, not malformed input. Without path ids nothing else refuses it.
            const schema = operationOf(r.route, method)?.json;
            fc.pre(!(schema && !/\[/.test(r.route) && c.body.kind === "json" && schema.safeParse(c.body.value).success));
            actAs(world, c.actor);
            const { req, params } = requestFor(method, r.route, c);
            const res = await handler(req, { params: Promise.resolve(params) });
            const text = await res.text();
            expect(res.status, `${c.actor} ${method} ${req.url}: ${text.slice(0, 200)}`).toBeLessThan(500);
            if (res.status >= 400) expect(JSON.parse(text)).toEqual(expect.objectContaining({ error: expect.any(String) }));
          }),
          { numRuns: RUNS_PER_OPERATION },
        );
      });
    }
  }

  // Tests in a file run in order: this one comes after every request above.
  it("changed nothing in the database", async () => {
    expect(await snapshot(world)).toEqual(before);
  });
});
