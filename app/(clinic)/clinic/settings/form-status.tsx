"use client";

import type { ActionState } from "./actions";

/** The outcome of a settings action, announced to screen readers. */
export function FormStatus({ state, testId }: { state: ActionState | null; testId?: string }) {
  if (!state) return null;
  return state.ok ? (
    <p role="status" className="rounded-lg bg-sage-50 p-3 text-sm font-medium text-sage-700" data-testid={testId}>{state.message}</p>
  ) : (
    <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700" data-testid={testId}>{state.message}</p>
  );
}

/** Error text of a field, from the browser's parse or the server's. */
export function fieldError(path: string, client: { message?: string } | undefined, state: ActionState | null): string | undefined {
  return client?.message ?? (state && !state.ok ? state.fieldErrors?.[path] : undefined);
}
