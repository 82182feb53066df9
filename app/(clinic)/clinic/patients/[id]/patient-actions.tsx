"use client";
// Invitation and archive buttons on a patient's page; both call the JSON API and refresh the page.

import { useRouter } from "next/navigation";
import { useState } from "react";

function useCall() {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  async function call(url: string, init: RequestInit, success: string) {
    setBusy(true);
    setMessage(null);
    try {
      const res = await fetch(url, { ...init, headers: { "content-type": "application/json" } });
      const body = await res.json().catch(() => ({}));
      setMessage(res.ok ? { ok: true, text: success } : { ok: false, text: body.error ?? "Something went wrong. Please try again." });
      if (res.ok) router.refresh();
    } finally {
      setBusy(false);
    }
  }
  return { busy, message, call };
}

function Status({ message }: { message: { ok: boolean; text: string } | null }) {
  if (!message) return null;
  return <p role={message.ok ? "status" : "alert"} className={message.ok ? "text-sm text-harbour-700" : "text-sm text-clay-700"}>{message.text}</p>;
}

export function InviteButton({ patientId, again }: { patientId: string; again: boolean }) {
  const { busy, message, call } = useCall();
  return (
    <div className="space-y-1">
      <button type="button" className="btn-primary" disabled={busy} onClick={() => call(`/api/patients/${patientId}/invite`, { method: "POST" }, "Invitation sent. The link works for 72 hours.")}>
        {busy ? "Sending…" : again ? "Send a new invitation" : "Send invitation"}
      </button>
      <Status message={message} />
    </div>
  );
}

export function ArchiveButton({ patientId, archived }: { patientId: string; archived: boolean }) {
  const { busy, message, call } = useCall();
  return (
    <div className="space-y-1">
      <button
        type="button"
        className={archived ? "btn-quiet" : "btn-danger"}
        disabled={busy}
        onClick={() => {
          if (!archived && !window.confirm("Archive this patient? They can no longer sign in; their records are kept.")) return;
          void call(`/api/patients/${patientId}`, { method: "PATCH", body: JSON.stringify({ archived: !archived }) }, archived ? "Patient unarchived." : "Patient archived.");
        }}
      >
        {archived ? "Unarchive patient" : "Archive patient"}
      </button>
      <Status message={message} />
    </div>
  );
}
