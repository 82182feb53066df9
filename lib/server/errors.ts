// One error type for the whole server side: a machine code, a human sentence and an HTTP status.
export class AppError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly options: { field?: string; code?: string; extra?: Record<string, unknown> } = {},
  ) {
    super(message);
    this.name = "AppError";
  }
  get field() {
    return this.options.field;
  }
}

export const notFound = (what = "That record") => new AppError(404, `${what} was not found.`, { code: "not_found" });
export const unauthorised = () => new AppError(401, "Please sign in first.", { code: "unauthenticated" });
export const forbidden = (message = "Your role does not allow this.") => new AppError(403, message, { code: "forbidden" });
export const badRequest = (message: string, field?: string) => new AppError(400, message, { field, code: "bad_request" });
export const conflict = (message: string, extra?: Record<string, unknown>) => new AppError(409, message, { code: "conflict", extra });
export const unprocessable = (message: string, field?: string) => new AppError(422, message, { field, code: "unprocessable" });
