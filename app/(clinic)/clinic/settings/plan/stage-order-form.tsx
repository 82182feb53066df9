"use client";

import { useState } from "react";
import type { StageKey } from "@/lib/domain/types";
import type { ActionState } from "../actions";
import { FormStatus } from "../form-status";
import { saveStageOrderAction } from "./actions";

type Props = { material: { id: string; name: string; stageOrder: StageKey[]; labels: Record<string, string> } };

/** Reorders one material's stages with move buttons; the server keeps the safe rules. */
export function StageOrderForm({ material }: Props) {
  const [order, setOrder] = useState<StageKey[]>(material.stageOrder);
  const [state, setState] = useState<ActionState | null>(null);
  const [saving, setSaving] = useState(false);
  const move = (i: number, by: -1 | 1) => {
    const next = [...order];
    [next[i], next[i + by]] = [next[i + by], next[i]];
    setOrder(next);
    setState(null);
  };
  return (
    <form
      className="space-y-2"
      aria-label={`Stage order for ${material.name}`}
      onSubmit={async (e) => {
        e.preventDefault();
        setSaving(true);
        setState(await saveStageOrderAction({ materialId: material.id, order }));
        setSaving(false);
      }}
    >
      <FormStatus state={state} />
      <ol className="space-y-1">
        {order.map((key, i) => (
          <li key={key} className="flex items-center gap-2 text-sm">
            <span className="w-6 text-right text-ink-muted">{i + 1}.</span>
            <span className="flex-1">{material.labels[key] ?? key}</span>
            <button type="button" className="btn-quiet min-h-8 px-2" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move ${material.labels[key] ?? key} earlier`}>↑</button>
            <button type="button" className="btn-quiet min-h-8 px-2" disabled={i === order.length - 1} onClick={() => move(i, 1)} aria-label={`Move ${material.labels[key] ?? key} later`}>↓</button>
          </li>
        ))}
      </ol>
      <button type="submit" className="btn-primary" disabled={saving}>{saving ? "Saving…" : `Save order for ${material.name}`}</button>
    </form>
  );
}
