"use client";

import { useTranslations } from "next-intl";
import type { RefObject } from "react";
import SignatureCanvas from "react-signature-canvas";
import { inkStats, signatureProblem } from "@/lib/domain/consent-signature";

/** The same rule the server applies, run on the canvas first so the patient hears it at once. */
export function checkDrawnSignature(pad: SignatureCanvas | null): string | null {
  if (!pad || pad.isEmpty()) return "Please draw your signature in the box.";
  const canvas = pad.getCanvas();
  const ctx = canvas.getContext("2d");
  if (!ctx) return null;
  if (canvas.width === 0 || canvas.height === 0) return "Please draw your signature in the box.";
  const { data, width, height } = ctx.getImageData(0, 0, canvas.width, canvas.height);
  return signatureProblem(inkStats(new Uint8Array(data.buffer), width, height));
}

/** A finger- or mouse-drawn signature box (react-signature-canvas), sized to its container. */
export function SignaturePad({ padRef, error, onChange }: { padRef: RefObject<SignatureCanvas | null>; error?: string | null; onChange?: () => void }) {
  const t = useTranslations("consent");
  return (
    <div>
      <p id="signature-label" className="field-label">{t("drawSignature")}</p>
      <p id="signature-hint" className="mb-2 text-sm text-ink-soft">{t("drawHint")}</p>
      <div className={`rounded-lg border-2 bg-white ${error ? "border-clay-600" : "border-ink-muted"}`}>
        <SignatureCanvas
          ref={padRef}
          penColor="#1f2a37"
          minWidth={1.2}
          maxWidth={3}
          clearOnResize={false}
          onEnd={onChange}
          canvasProps={{
            className: "block h-44 w-full touch-none rounded-lg",
            role: "img",
            "aria-labelledby": "signature-label",
            "aria-describedby": error ? "signature-hint signature-error" : "signature-hint",
            "data-testid": "signature-canvas",
          } as React.CanvasHTMLAttributes<HTMLCanvasElement>}
        />
      </div>
      {error ? <p id="signature-error" className="field-error" role="alert">{error}</p> : null}
      <button type="button" className="btn-quiet mt-2" onClick={() => { padRef.current?.clear(); onChange?.(); }}>
        {t("clearBox")}
      </button>
    </div>
  );
}
