// Route handler plumbing: every error becomes JSON `{ error, field? }` with the right status.
import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import { ZodError, type ZodType } from "zod";
import { clientIpFrom } from "./client-ip";
import { AppError, badRequest } from "./errors";

type Handler<C> = (req: NextRequest, ctx: C) => Promise<Response>;

export function errorResponse(err: unknown): NextResponse {
  if (err instanceof AppError) {
    return NextResponse.json({ error: err.message, ...(err.field ? { field: err.field } : {}), ...err.options.extra }, { status: err.status });
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

export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    try {
      return await handler(req, ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Parses a JSON body against a schema; malformed JSON and wrong shapes are 400s, not 500s. */
export async function readJson<T>(req: Request, schema: ZodType<T>): Promise<T> {
  let body: unknown;
  try {
    const text = await req.text();
    // An empty body is an empty object, so actions without fields need no "{}".
    body = text.trim() === "" ? {} : JSON.parse(text);
  } catch {
    throw badRequest("The request body must be valid JSON.");
  }
  return schema.parse(body);
}

export function clientInfo(req: Request): { ip: string; userAgent: string } {
  return { ip: clientIpFrom(req.headers), userAgent: req.headers.get("user-agent") ?? "unknown" };
}
