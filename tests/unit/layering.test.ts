// The house rules about who may import what, checked over the source tree: pages and components
// reach data only through lib/data, components do not reach into route folders, the models know
// nothing of e-mail, and tests fake a session with the one helper in tests/support.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(import.meta.dirname, "../..");

function sources(dir: string): string[] {
  return readdirSync(path.join(root, dir), { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.(ts|tsx|mts)$/.test(e.name))
    .map((e) => path.relative(root, path.join(e.parentPath, e.name)));
}

/** The files under `dir` whose import specifiers match `pattern`. */
function importing(dir: string, pattern: RegExp): string[] {
  return sources(dir).filter((file) => {
    const text = readFileSync(path.join(root, file), "utf8");
    return [...text.matchAll(/(?:from|import)\s*\(?\s*["']([^"']+)["']/g)].some((m) => pattern.test(m[1]));
  });
}

describe("layering", () => {
  it("finds the files it checks (the scan itself works)", () => {
    expect(sources("app").length).toBeGreaterThan(20);
    expect(importing("lib/data", /^@\/db\/models/).length).toBeGreaterThan(5);
  });

  it("pages, route handlers and components never import the models", () => {
    expect(importing("app", /(^@\/db\/models|\/db\/models)/)).toEqual([]);
    expect(importing("components", /(^@\/db\/models|\/db\/models)/)).toEqual([]);
  });

  it("components do not import from route folders", () => {
    expect(importing("components", /^@\/app\//)).toEqual([]);
  });

  it("the models do not import the mail code (lib/mail registers its own hooks)", () => {
    expect(importing("db/models", /^@\/lib\/mail|\/lib\/mail/)).toEqual([]);
  });

  it("every module that creates or changes visits loads the mail hooks, so the outbox is written", () => {
    // A visit change goes through Appointment.create or an instance update in one of these.
    const writers = sources("lib").concat(sources("db/seed")).filter((file) => {
      const text = readFileSync(path.join(root, file), "utf8");
      return /Appointment\.create\(|(?:visit|fresh|appointment)\.update\(\{/.test(text);
    });
    expect(writers.length).toBeGreaterThanOrEqual(4);
    const loaders = new Set([...importing("lib", /^@\/lib\/mail\/hooks$/), ...importing("db/seed", /^@\/lib\/mail\/hooks$/)]);
    // db/seed/demo.ts loads them for the seeders it calls.
    expect(writers.filter((f) => !loaders.has(f) && !f.startsWith("db/seed/demo-"))).toEqual([]);
  });

  it("tests fake a session only through tests/support/session.ts", () => {
    const copies = sources("tests").filter((file) => {
      if (file === "tests/support/session.ts" || file === "tests/unit/layering.test.ts") return false;
      const text = readFileSync(path.join(root, file), "utf8");
      const ownMock = /vi\.mock\(\s*["']@\/lib\/auth\/session["']/.test(text) && !/fakeSessionModule\(\)/.test(text);
      const ownBuilder = /role:\s*u\.role,\s*clinicId:\s*u\.clinicId/.test(text);
      return ownMock || ownBuilder;
    });
    expect(copies).toEqual([]);
  });
});
