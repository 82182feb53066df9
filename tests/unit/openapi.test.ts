// The published API document: one operation for every method of every route file, and the shape
// OpenAPI 3.1 asks for (checked against the specification's required fields [P] OpenAPI
// Specification 3.1.0, sections 4.8.1 OpenAPI Object, 4.8.10 Operation Object, 4.8.16 Responses Object).
import { describe, expect, it } from "vitest";
import { buildOpenApi } from "@/lib/server/openapi";
import { apiRouteFiles } from "../support/api-routes";

const doc = buildOpenApi("http://localhost:3000");
const METHODS = ["get", "put", "post", "delete", "options", "head", "patch", "trace"];

describe("OpenAPI document", () => {
  it("has an operation for every method of every route file, and none for routes that do not exist", () => {
    const fromFiles = apiRouteFiles().flatMap((f) =>
      f.methods.map((m) => `${m.toLowerCase()} ${f.route.replace(/\[\.\.\.([^\]]+)\]/g, "{$1}").replace(/\[([^\]]+)\]/g, "{$1}")}`),
    );
    const documented = Object.entries(doc.paths).flatMap(([path, item]) => Object.keys(item).map((m) => `${m} ${path}`));
    expect(fromFiles.filter((k) => !documented.includes(k)), "routes missing from lib/server/openapi.ts").toEqual([]);
    expect(documented.filter((k) => !fromFiles.includes(k)), "documented operations without a route file").toEqual([]);
  });

  it("has the OpenAPI 3.1 shape: version, info, paths, operations with responses and declared path parameters", () => {
    expect(doc.openapi).toMatch(/^3\.1\.\d+$/);
    expect(doc.info).toEqual(expect.objectContaining({ title: expect.any(String), version: expect.any(String) }));
    const ids = new Set<string>();
    for (const [path, item] of Object.entries(doc.paths)) {
      expect(path.startsWith("/")).toBe(true);
      for (const [method, op] of Object.entries(item as Record<string, Record<string, unknown>>)) {
        expect(METHODS).toContain(method);
        const responses = op.responses as Record<string, { description?: string }>;
        expect(Object.keys(responses).length, `${method} ${path}`).toBeGreaterThan(0);
        for (const [code, r] of Object.entries(responses)) {
          expect(code).toMatch(/^[1-5](\d\d|XX)$|^default$/);
          expect(typeof r.description, `${method} ${path} ${code}`).toBe("string");
        }
        // Each {template} in the path is a required path parameter (spec 4.8.12: "required" MUST be true for path).
        const declared = ((op.parameters ?? []) as { name: string; in: string; required: boolean }[]).filter((p) => p.in === "path");
        const templated = [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
        expect(declared.map((p) => p.name).sort(), `${method} ${path}`).toEqual(templated.sort());
        expect(declared.every((p) => p.required)).toBe(true);
        // operationId is unique across the document (spec 4.8.10).
        expect(ids.has(op.operationId as string), op.operationId as string).toBe(false);
        ids.add(op.operationId as string);
      }
    }
  });

  it("describes request bodies from the routes' own zod schemas", () => {
    const post = doc.paths["/api/proposals"].post as { requestBody: { content: Record<string, { schema: { properties: Record<string, unknown>; required: string[] } }> } };
    const schema = post.requestBody.content["application/json"].schema;
    expect(Object.keys(schema.properties)).toEqual(expect.arrayContaining(["patientId", "dentistId", "tooth", "fee", "options"]));
    expect(schema.required).toEqual(expect.arrayContaining(["patientId", "tooth", "fee", "options"]));
    expect(schema.properties.patientId).toEqual(expect.objectContaining({ format: "uuid" }));
    const verify = doc.paths["/api/consents/verify"].post as { requestBody: { content: Record<string, unknown> } };
    expect(Object.keys(verify.requestBody.content)).toEqual(["multipart/form-data"]);
  });
});

describe("documentation stays inside the repository", () => {
  it("README, DEVELOPERS and docs/ link to nothing outside it", async () => {
    const { readFileSync, readdirSync, existsSync } = await import("node:fs");
    const path = await import("node:path");
    const root = path.resolve(import.meta.dirname, "../..");
    const files = ["README.md", "DEVELOPERS.md", ...(existsSync(path.join(root, "docs")) ? readdirSync(path.join(root, "docs")).map((f) => `docs/${f}`) : [])];
    for (const f of files) {
      const text = readFileSync(path.join(root, f), "utf8");
      expect(text, f).not.toMatch(/\.\.\/shared/);
      // A relative link may climb to the repository's root, never above it.
      expect(text, f).not.toMatch(f.startsWith("docs/") ? /\]\((\.\.\/){2}/ : /\]\(\.\.\//);
    }
    expect(readFileSync(path.join(root, "README.md"), "utf8")).toMatch(/docs\/api\.md/);
    expect(readFileSync(path.join(root, "README.md"), "utf8")).toMatch(/\/api\/openapi\.json/);
  });
});

// Payments
describe("payments operations", () => {
  it("take their bodies and query from the payment forms' own schemas", async () => {
    const { DESK_METHODS } = await import("@/lib/domain/payment-schemas");
    type Op = { requestBody?: { required: boolean; content: Record<string, { schema: { properties: Record<string, { enum?: string[] }>; required?: string[] } }> }; parameters?: { name: string; in: string; required: boolean }[]; responses: Record<string, unknown> };
    const op = (path: string, method: string) => (doc.paths[path] as Record<string, Op>)[method];
    const desk = op("/api/appointments/{id}/desk-payments", "post").requestBody!;
    expect(desk.required).toBe(true);
    expect(desk.content["application/json"].schema.properties.method.enum).toEqual([...DESK_METHODS]);
    expect(desk.content["application/json"].schema.required).toEqual(expect.arrayContaining(["method", "amount"]));
    expect(Object.keys(op("/api/proposals/{id}/plan-estimate", "put").requestBody!.content["application/json"].schema.properties)).toEqual(
      expect.arrayContaining(["coveragePercent", "deductibleRemaining", "annualMaxRemaining", "preauthReference"]),
    );
    expect(op("/api/appointments/{id}/deposit/waive", "post").requestBody!.content["application/json"].schema.required).toEqual(["reason"]);
    const query = op("/api/payments", "get").parameters!.filter((p) => p.in === "query");
    expect(query.map((p) => p.name).sort()).toEqual(["format", "from", "status", "to"]);
    expect(query.every((p) => !p.required)).toBe(true);
    // Only the checkout talks to the payment service, so only it documents a 502.
    expect(Object.keys(op("/api/appointments/{id}/deposit", "post").responses)).toContain("502");
    expect(Object.keys(op("/api/appointments/{id}/deposit/waive", "post").responses)).not.toContain("502");
    // The webhook is called by the payment service, which has no session.
    expect((doc.paths["/api/payments/webhook"] as Record<string, { security?: unknown[] }>).post.security).toEqual([]);
  });
});
