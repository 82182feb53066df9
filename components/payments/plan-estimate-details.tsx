"use client";
// The dental-plan form sits in a closed disclosure on the proposal page: its code (a form library,
// the shared schema and the message provider) is fetched when the patient opens it, not with the page.
import dynamic from "next/dynamic";
import { useState } from "react";
import type PlanEstimateLazyType from "./plan-estimate-lazy";

const PlanEstimateLazy = dynamic(() => import("./plan-estimate-lazy"));

type Props = React.ComponentProps<typeof PlanEstimateLazyType> & { summary: string; caution: string };

export function PlanEstimateDetails({ summary, caution, ...form }: Props) {
  const [open, setOpen] = useState(false);
  return (
    <details className="card text-sm" onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="cursor-pointer font-semibold">{summary}</summary>
      <div className="mt-3">
        {open ? <PlanEstimateLazy {...form} /> : null}
        <p className="mt-2 text-xs text-ink-soft">{caution}</p>
      </div>
    </details>
  );
}
