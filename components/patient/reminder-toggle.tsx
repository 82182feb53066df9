"use client";
// A switch on the patient's visit page: e-mail reminders before this visit, on or off.
import { useTranslations } from "next-intl";
import { useId, useState, useTransition } from "react";
import { setRemindersAction } from "./reminder-toggle-action";
import { reminderToggleSchema } from "./reminder-toggle-schema";

type Props = {
  appointmentId: string;
  enabled: boolean;
  /** e.g. "48 hours and 2 hours" (the sentence adds "before the visit") */
  whenText?: string;
};

export function ReminderToggle({ appointmentId, enabled: initial, whenText }: Props) {
  const t = useTranslations("reminders");
  const [enabled, setEnabled] = useState(initial);
  const [error, setError] = useState<string | null>(null);
  const [pending, start] = useTransition();
  const labelId = useId();
  const statusId = useId();

  function toggle() {
    const next = !enabled;
    const input = reminderToggleSchema.safeParse({ appointmentId, enabled: next });
    if (!input.success) return setError(input.error.issues[0]?.message ?? "That did not work.");
    setError(null);
    start(async () => {
      const result = await setRemindersAction(input.data);
      if (result.ok) setEnabled(result.enabled);
      else setError(result.error);
    });
  }

  return (
    <div className="card space-y-2" data-testid="reminder-toggle">
      <div className="flex items-center justify-between gap-4">
        <div>
          <p id={labelId} className="font-semibold">{t("title")}</p>
          <p id={statusId} className="text-sm text-ink-soft" aria-live="polite">
            {pending ? t("saving") : enabled ? (whenText ? t("on", { when: whenText }) : t("onDefault")) : t("off")}
          </p>
        </div>
        <button
          type="button"
          role="switch"
          aria-checked={enabled}
          aria-labelledby={labelId}
          aria-describedby={statusId}
          disabled={pending}
          onClick={toggle}
          className={`relative inline-flex h-8 w-14 shrink-0 items-center rounded-full border-2 transition-colors disabled:opacity-60 ${
            enabled ? "border-harbour-700 bg-harbour-600" : "border-ink-muted bg-paper-deep"
          }`}
        >
          <span className={`inline-block h-6 w-6 rounded-full bg-white shadow transition-transform ${enabled ? "translate-x-6" : "translate-x-0.5"}`} />
        </button>
      </div>
      {error ? <p role="alert" className="field-error">{error}</p> : null}
    </div>
  );
}
