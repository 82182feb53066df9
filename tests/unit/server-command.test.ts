// Every way of starting an app instance runs scripts/server.mjs with the same V8 heap cap.
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(import.meta.dirname, "../..");

describe("app server command", () => {
  it("uses one heap cap in npm start, the scripts and the browser tests", async () => {
    const lib = (await import(path.join(root, "scripts/lib.mjs"))) as { APP_HEAP_FLAG: string; appServerCommand: (port: number) => [string, string[]] };
    expect(lib.APP_HEAP_FLAG).toMatch(/^--max-old-space-size=\d+$/);
    expect(lib.appServerCommand(3000)[1]).toContain(lib.APP_HEAP_FLAG);
    const pkg = JSON.parse(readFileSync(path.join(root, "package.json"), "utf8"));
    expect(pkg.scripts.start).toBe(`node ${lib.APP_HEAP_FLAG} scripts/server.mjs`);
    expect(readFileSync(path.join(root, "playwright.config.ts"), "utf8")).toContain(`node ${lib.APP_HEAP_FLAG} scripts/server.mjs`);
  });
});
