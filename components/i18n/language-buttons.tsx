"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { LOCALE_NAMES, LOCALES, type Locale } from "@/lib/i18n/locale";
import { setLanguageAction } from "./language-action";

/** The switcher's buttons; its words are passed in, so no message catalogue reaches the browser. */
export function LanguageButtons({ current, label, failed: failedText }: { current: Locale; label: string; failed: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [failed, setFailed] = useState(false);

  function choose(language: Locale) {
    setFailed(false);
    start(async () => {
      const result = await setLanguageAction({ language });
      if (result.ok) router.refresh();
      else setFailed(true);
    });
  }

  return (
    <div role="group" aria-label={label} className="flex items-center gap-1" data-testid="language-switcher">
      {LOCALES.map((l) => (
        <button key={l} type="button" lang={l} aria-pressed={l === current} disabled={pending} onClick={() => choose(l)}
          className={`min-h-10 rounded-md px-2 text-sm font-semibold ${l === current ? "bg-harbour-50 text-harbour-800 ring-1 ring-harbour-600" : "text-ink-soft hover:bg-paper-deep"}`}>
          {LOCALE_NAMES[l]}
        </button>
      ))}
      {failed ? <span role="alert" className="text-sm text-clay-700">{failedText}</span> : null}
    </div>
  );
}
