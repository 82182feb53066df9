// Route handler plumbing: every error becomes JSON `{ error, field? }` with the right status, every
// answer is `Cache-Control: no-store`, mutating requests show our Origin and the content type the
// route reads, and bodies are read through a streamed size cap before any parsing.
import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import { ZodError, type ZodType } from "zod";
import { idSchema } from "@/lib/domain/input";
import { clientIpFrom } from "./client-ip";
import { fromDatabaseError } from "./db-errors";
import { AppError, badRequest, forbidden } from "./errors";
import { acceptsType, expectedTypeText, isOriginExempt, isSameOrigin, mediaType, MUTATING_METHODS, ownHosts, type BodyKind } from "./request-policy";

type Handler<C> = (req: NextRequest, ctx: C) => Promise<Response>;

/** Default cap for a JSON body. */
export const JSON_BODY_LIMIT = 64 * 1024;

export function errorResponse(err: unknown): NextResponse {
  const known = err instanceof AppError ? err : fromDatabaseError(err);
  if (known) {
    return NextResponse.json({ error: known.message, ...(known.field ? { field: known.field } : {}), ...known.options.extra }, { status: known.status });
  }
  if (err instanceof ZodError) {
    const issue = err.issues[0];
    const field = issue?.path.join(".") || undefined;
    return NextResponse.json({ error: issue?.message ?? "The request is not valid.", ...(field ? { field } : {}) }, { status: 400 });
  }
  // Log the error itself (ids and messages, never request bodies with personal data).
  console.error("Unhandled error in route handler:", err instanceof Error ? err.stack : err);
  return NextResponse.json({ error: "Something went wrong on our side. Please try again." }, { status: 500 });
}

export type RouteOptions = {
  /** What a mutating request's body must be: JSON unless said otherwise. */
  body?: BodyKind;
};

/** Wraps a route handler: request checks first, then the handler, errors as JSON, answers never cached. */
export function route<C = unknown>(handler: Handler<C>, options: RouteOptions = {}): Handler<C> {
  const kind = options.body ?? "json";
  return async (req, ctx) => {
    let res: Response;
    try {
      checkRequest(req, kind);
      res = await handler(req, ctx);
    } catch (err) {
      res = errorResponse(err);
    }
    if (!/no-store/.test(res.headers.get("cache-control") ?? "")) res.headers.set("Cache-Control", "no-store");
    return res;
  };
}

/** The Origin and content-type checks of a mutating request (exported for handlers that cannot use `route`). */
export function checkRequest(req: Request, kind: BodyKind = "json"): void {
  if (!MUTATING_METHODS.has(req.method)) return;
  const url = new URL(req.url);
  if (!isOriginExempt(url.pathname) && !isSameOrigin(req.headers, ownHosts(req.headers, req.url))) {
    throw forbidden("This request must come from Cuspal's own pages.");
  }
  const type = req.headers.get("content-type");
  // Without a content type the body must be empty (checked when it is read).
  if (type !== null && !acceptsType(kind, type)) throw unsupportedType(kind);
}

const unsupportedType = (kind: BodyKind) => new AppError(415, `Send the request body as ${expectedTypeText(kind)}.`, { code: "unsupported_media_type" });

export const tooLarge = (limit: number, message?: string, field?: string) =>
  new AppError(413, message ?? `The request body is too large (at most ${Math.round(limit / 1024)} kB).`, { code: "too_large", field });

/**
 * Reads the raw body, refusing it with 413 as soon as it passes `limit` bytes: the declared
 * Content-Length is checked first and the stream is counted too, so a chunked body cannot slip past.
 */
export async function readBody(req: Request, limit: number, message?: string, field?: string): Promise<Uint8Array> {
  const declared = Number(req.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > limit) throw tooLarge(limit, message, field);
  if (!req.body) return new Uint8Array();
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limit, message, field);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/** Reads the body as UTF-8 text under the cap. */
export async function readText(req: Request, limit = JSON_BODY_LIMIT): Promise<string> {
  return new TextDecoder("utf-8", { fatal: false }).decode(await readBody(req, limit));
}

/**
 * Parses a JSON body against a schema under a streamed cap; malformed JSON and wrong shapes are
 * 400s, a body without the JSON content type 415, an oversized one 413. An empty body is `{}`.
 */
export async function readJson<T>(req: Request, schema: ZodType<T>, options: { limit?: number; tooLargeMessage?: string; tooLargeField?: string } = {}): Promise<T> {
  const bytes = await readBody(req, options.limit ?? JSON_BODY_LIMIT, options.tooLargeMessage, options.tooLargeField);
  const text = new TextDecoder().decode(bytes);
  if (text.trim() === "") return schema.parse({});
  if (mediaType(req.headers.get("content-type")) !== "application/json") throw unsupportedType("json");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw badRequest("The request body must be valid JSON.");
  }
  return schema.parse(body);
}

/** Reads a form body (multipart or URL-encoded) under a streamed cap. */
export async function readForm(req: Request, limit: number, options: { tooLargeMessage?: string; field?: string } = {}): Promise<FormData> {
  const type = req.headers.get("content-type") ?? "";
  const media = mediaType(type);
  if (media !== "multipart/form-data" && media !== "application/x-www-form-urlencoded") {
    throw new AppError(415, "Send the request as a form (multipart/form-data).", { code: "unsupported_media_type", field: options.field });
  }
  const bytes = await readBody(req, limit, options.tooLargeMessage, options.field);
  try {
    return await new Response(new Uint8Array(bytes), { headers: { "content-type": type } }).formData();
  } catch {
    throw badRequest("The form could not be read.", options.field);
  }
}

/** A path or query id: a UUID, or 400 naming the field (such a value cannot name any record). */
export function parseId(value: unknown, field = "id"): string {
  const parsed = idSchema().safeParse(value);
  if (!parsed.success) throw badRequest(`${field} must be a record id (a UUID).`, field);
  return parsed.data;
}

/** A numeric row id (bigint serial), 1 up to 2^53 - 1. */
export function parseSerialId(value: unknown, field = "id", what = "The id"): number {
  const n = typeof value === "string" && /^[1-9]\d{0,15}$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(n)) throw badRequest(`${what} is not valid.`, field);
  return n;
}

/** The query string parsed against a schema (repeated keys keep their last value). */
export function parseQuery<T>(req: Request, schema: ZodType<T>): T {
  return schema.parse(Object.fromEntries(new URL(req.url).searchParams));
}

/** The `params` of a dynamic route with each named id checked as a UUID. */
export async function idParams<P extends Record<string, string>>(params: Promise<P>, ...keys: (keyof P & string)[]): Promise<P> {
  const p = await params;
  const out: Record<string, string> = { ...p };
  for (const k of keys) out[k] = parseId(p[k], k);
  return out as P;
}

export function clientInfo(req: Request): { ip: string; userAgent: string } {
  return { ip: clientIpFrom(req.headers), userAgent: req.headers.get("user-agent") ?? "unknown" };
}

