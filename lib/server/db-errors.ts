// Database errors that can only come from what the caller sent become 4xx answers, never 500s.
import { DatabaseError, ForeignKeyConstraintError, UniqueConstraintError, ValidationError } from "sequelize";
import { AppError } from "./errors";

// SQLSTATE classes raised by values from the request: 22xxx is "data exception" (bad text for a
// uuid, a date out of range, a number too large, a string too long), per PostgreSQL's appendix A.
const INPUT_DATA_STATES = /^22/;

export function fromDatabaseError(err: unknown): AppError | null {
  if (err instanceof UniqueConstraintError) return new AppError(409, "That already exists.", { code: "conflict" });
  if (err instanceof ForeignKeyConstraintError) return new AppError(404, "Something the request refers to was not found.", { code: "not_found" });
  if (err instanceof ValidationError) {
    const item = err.errors?.[0];
    return new AppError(400, "The request is not valid.", { code: "bad_request", field: item?.path ?? undefined });
  }
  if (err instanceof DatabaseError) {
    const code = (err.parent as { code?: string } | undefined)?.code;
    if (code && INPUT_DATA_STATES.test(code)) return new AppError(400, "A value in the request is not valid.", { code: "bad_request" });
  }
  return null;
}
