// Every route handler file under app/api and the HTTP methods it exports, read from the files
// themselves, so a new route cannot hide from the matrix, the fuzz or the API document.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "../..");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type HttpMethod = (typeof METHODS)[number];

export type RouteFile = { file: string; route: string; methods: HttpMethod[] };

function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? walk(p) : e.name === "route.ts" || e.name === "route.tsx" ? [p] : [];
  });
}

/** Exported methods: `export const GET`, `export async function POST`, `export { handler as GET }`. */
export function exportedMethods(source: string): HttpMethod[] {
  const found = new Set<HttpMethod>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) found.add(m[1] as HttpMethod);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(",")) {
      const name = part.split(/\s+as\s+/).pop()!.trim();
      if ((METHODS as readonly string[]).includes(name)) found.add(name as HttpMethod);
    }
  }
  return METHODS.filter((m) => found.has(m));
}

export function apiRouteFiles(): RouteFile[] {
  return walk(path.join(ROOT, "app/api"))
    .map((file) => ({
      file,
      route: "/" + path.relative(path.join(ROOT, "app"), path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/"),
      methods: exportedMethods(readFileSync(file, "utf8")),
    }))
    .sort((a, b) => a.route.localeCompare(b.route));
}
