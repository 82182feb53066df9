"use client";
// The dental-plan form sits in a closed disclosure on the proposal page: its code (a form library
// and the shared schema) is fetched when the patient opens it, not with the page.
import dynamic from "next/dynamic";
import { useState } from "react";
import type { PlanEstimateForm as Form } from "./plan-estimate-form";

const PlanEstimateForm = dynamic(() => import("./plan-estimate-form").then((m) => m.PlanEstimateForm));

type Props = React.ComponentProps<typeof Form> & { summary: string; caution: string };

export function PlanEstimateDetails({ summary, caution, ...form }: Props) {
  const [open, setOpen] = useState(false);
  return (
    <details className="card text-sm" onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="cursor-pointer font-semibold">{summary}</summary>
      <div className="mt-3">
        {open ? <PlanEstimateForm {...form} /> : null}
        <p className="mt-2 text-xs text-ink-soft">{caution}</p>
      </div>
    </details>
  );
}
