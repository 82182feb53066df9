"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import type SignatureCanvas from "react-signature-canvas";
import { SectionBody, VisitRows } from "@/components/consent/consent-document";
import { ANSWER_LABELS, ANSWERS, QUESTIONS, type Question } from "@/lib/domain/consent-questionnaire";
import { consentFormSchema, type ConsentFormInput, type ConsentFormValues } from "@/lib/domain/consent-schemas";
import type { AssembledConsent } from "@/lib/domain/consent-text";
import { checkDrawnSignature, SignaturePad } from "./signature-pad";

type Props = { appointmentId: string; templateId: string; textSha256: string; document: AssembledConsent; patientName: string };

const STEPS = ["Your health", "Read the consent", "Sign"] as const;
const GROUPS = [...new Set(QUESTIONS.map((q) => q.group))];

/** Questionnaire → read and tick each section → agree to e-records, type name, draw signature → sign. */
export function ConsentFlow({ appointmentId, templateId, textSha256, document, patientName }: Props) {
  const router = useRouter();
  const [step, setStep] = useState(0);
  const heading = useRef<HTMLHeadingElement>(null);
  const pad = useRef<SignatureCanvas | null>(null);
  const [signatureError, setSignatureError] = useState<string | null>(null);
  const [serverError, setServerError] = useState<{ message: string; reload: boolean } | null>(null);
  const [done, setDone] = useState(false);
  const first = useRef(true);

  const { register, handleSubmit, trigger, setError, clearErrors, formState } = useForm<ConsentFormInput, unknown, ConsentFormValues>({
    resolver: zodResolver(consentFormSchema),
    defaultValues: { answers: { otherAllergies: "", medicines: "", notes: "" } as ConsentFormInput["answers"], acknowledged: [], electronicRecords: false as unknown as true, typedName: "" },
    shouldFocusError: true,
  });
  const { errors, isSubmitting } = formState;

  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    heading.current?.focus();
    heading.current?.scrollIntoView({ block: "start" });
  }, [step]);

  async function next() {
    const ok = await trigger(step === 0 ? "answers" : "acknowledged", { shouldFocus: true });
    if (ok) setStep((s) => s + 1);
  }

  async function sign(values: ConsentFormValues) {
    setServerError(null);
    const problem = checkDrawnSignature(pad.current);
    setSignatureError(problem);
    if (problem) return;
    let res: Response;
    try {
      res = await fetch("/api/consents", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ ...values, appointmentId, templateId, textSha256, signature: pad.current!.toDataURL("image/png") }),
      });
    } catch {
      setServerError({ message: "We could not reach the clinic's server. Check your connection and try again.", reload: false });
      return;
    }
    if (res.status === 201) {
      setDone(true);
      router.refresh();
      return;
    }
    const body: { error?: string; field?: string } = await res.json().catch(() => ({}));
    const message = body.error ?? "Signing did not work. Please try again.";
    if (body.field === "signature") setSignatureError(message);
    else if (body.field === "typedName") setError("typedName", { message }, { shouldFocus: true });
    else setServerError({ message, reload: body.field === "templateId" || body.field === "textSha256" });
  }

  if (done) {
    return (
      <p role="status" className="card font-semibold" data-testid="consent-signed">
        Thank you. Your consent is signed and sealed; a copy is on its way to your e-mail.
      </p>
    );
  }

  const answerError = (q: Question) => errors.answers?.[q.key]?.message;

  return (
    <form onSubmit={(e) => void handleSubmit(sign)(e)} noValidate className="space-y-5" aria-describedby="consent-steps">
      <ol id="consent-steps" className="flex gap-2 text-sm" aria-label="Steps">
        {STEPS.map((label, i) => (
          <li key={label} aria-current={i === step ? "step" : undefined}
            className={`flex-1 rounded-md border px-2 py-1 text-center ${i === step ? "border-harbour-600 bg-harbour-50 font-semibold text-harbour-800" : i < step ? "border-line bg-white text-ink-soft" : "border-line text-ink-muted"}`}>
            {i + 1}. {label}
          </li>
        ))}
      </ol>
      <h2 ref={heading} tabIndex={-1} className="text-xl font-semibold outline-none">
        Step {step + 1} of {STEPS.length}: {STEPS[step]}
      </h2>

      <div hidden={step !== 0} className="space-y-5">
        <p>These questions help your dentist keep you safe. Answer as well as you can; &ldquo;Not sure&rdquo; is a fine answer, and your dentist will ask you about it.</p>
        {GROUPS.map((group) => (
          <section key={group} className="card space-y-4" aria-labelledby={`group-${group}`}>
            <h3 id={`group-${group}`} className="text-lg font-semibold">{group}</h3>
            {QUESTIONS.filter((q) => q.group === group).map((q) => (
              <fieldset key={q.key} aria-describedby={answerError(q) ? `${q.key}-error` : undefined} data-testid={`question-${q.key}`}>
                <legend className="mb-1 font-medium">{q.text}</legend>
                {q.hint ? <p className="mb-1 text-sm text-ink-soft">{q.hint}</p> : null}
                <div className="flex flex-wrap gap-2">
                  {ANSWERS.map((a) => (
                    <label key={a} className="inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-ink-muted bg-white px-3 has-[:checked]:border-harbour-600 has-[:checked]:bg-harbour-50 has-[:checked]:font-semibold">
                      <input type="radio" value={a} className="size-5 accent-harbour-600" {...register(`answers.${q.key}`, { onChange: () => clearErrors(`answers.${q.key}`) })} />
                      {ANSWER_LABELS[a]}
                    </label>
                  ))}
                </div>
                {answerError(q) ? <p id={`${q.key}-error`} className="field-error">{answerError(q)}</p> : null}
              </fieldset>
            ))}
          </section>
        ))}
        <section className="card space-y-4" aria-labelledby="group-more">
          <h3 id="group-more" className="text-lg font-semibold">In your own words</h3>
          <div>
            <label htmlFor="otherAllergies" className="field-label">Any other allergies? (optional)</label>
            <textarea id="otherAllergies" rows={2} className="field-input" {...register("answers.otherAllergies")} />
            {errors.answers?.otherAllergies ? <p className="field-error">{errors.answers.otherAllergies.message}</p> : null}
          </div>
          <div>
            <label htmlFor="medicines" className="field-label">Medicines you take (optional)</label>
            <textarea id="medicines" rows={2} className="field-input" {...register("answers.medicines")} />
          </div>
          <div>
            <label htmlFor="notes" className="field-label">Anything else your dentist should know? (optional)</label>
            <textarea id="notes" rows={2} className="field-input" {...register("answers.notes")} />
          </div>
        </section>
        <button type="button" className="btn-primary w-full" onClick={next}>Continue to the consent</button>
      </div>

      <div hidden={step !== 1} className="space-y-4">
        <p>Please read each part and tick it. Ask your dentist about anything that is unclear, before you sign or at the clinic.</p>
        <section className="card space-y-2" aria-labelledby="visit-heading">
          <h3 id="visit-heading" className="text-lg font-semibold">Your visit</h3>
          <VisitRows rows={document.visit} />
        </section>
        {document.sections.map((s) => (
          <section key={s.key} className="card space-y-3" aria-labelledby={`section-${s.key}`} data-testid={`section-${s.key}`}>
            <h3 id={`section-${s.key}`} className="text-lg font-semibold">{s.heading}</h3>
            <SectionBody section={s} />
            <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg bg-paper p-2 font-medium">
              <input type="checkbox" value={s.key} className="size-6 accent-harbour-600" {...register("acknowledged", { onChange: () => { if (errors.acknowledged) void trigger("acknowledged"); } })} />
              I have read and understood this part
            </label>
          </section>
        ))}
        {errors.acknowledged ? <p className="field-error" role="alert">{errors.acknowledged.message ?? errors.acknowledged.root?.message}</p> : null}
        <div className="flex gap-2">
          <button type="button" className="btn-quiet" onClick={() => setStep(0)}>Back</button>
          <button type="button" className="btn-primary flex-1" onClick={next}>Continue to signing</button>
        </div>
      </div>

      <div hidden={step !== 2} className="space-y-4">
        {serverError ? (
          <div role="alert" className="rounded-lg bg-clay-50 p-3 text-clay-700" data-testid="sign-error">
            <p className="font-medium">{serverError.message}</p>
            {serverError.reload ? <button type="button" className="btn-quiet mt-2" onClick={() => window.location.reload()}>Reload the page</button> : null}
          </div>
        ) : null}
        <section className="card space-y-2" aria-labelledby="records-heading">
          <h3 id="records-heading" className="text-lg font-semibold">{document.electronicRecords.heading}</h3>
          {document.electronicRecords.text.map((t) => <p key={t}>{t}</p>)}
          <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg bg-paper p-2 font-medium">
            <input type="checkbox" className="size-6 accent-harbour-600" aria-describedby={errors.electronicRecords ? "records-error" : undefined} {...register("electronicRecords", { onChange: () => clearErrors("electronicRecords") })} />
            I agree to sign and receive these records electronically
          </label>
          {errors.electronicRecords ? <p id="records-error" className="field-error">{errors.electronicRecords.message}</p> : null}
        </section>
        <section className="card space-y-4" aria-labelledby="sign-heading">
          <h3 id="sign-heading" className="text-lg font-semibold">Your signature</h3>
          <p>By signing you confirm that you have read this consent, had the chance to ask questions, and agree to the treatment described.</p>
          <div>
            <label htmlFor="typedName" className="field-label">Type your full name</label>
            <p id="typedName-hint" className="mb-1 text-sm text-ink-soft">As the clinic has it: {patientName}</p>
            <input id="typedName" autoComplete="name" className="field-input" aria-invalid={!!errors.typedName}
              aria-describedby={errors.typedName ? "typedName-hint typedName-error" : "typedName-hint"} {...register("typedName")} />
            {errors.typedName ? <p id="typedName-error" className="field-error">{errors.typedName.message}</p> : null}
          </div>
          {/* Mounted only when visible: the canvas takes its pixel size from its box when it mounts. */}
          {step === 2 ? <SignaturePad padRef={pad} error={signatureError} onChange={() => setSignatureError(null)} /> : null}
        </section>
        <div className="flex gap-2">
          <button type="button" className="btn-quiet" onClick={() => setStep(1)}>Back</button>
          <button type="submit" className="btn-primary flex-1" disabled={isSubmitting}>{isSubmitting ? "Signing…" : "Sign consent"}</button>
        </div>
      </div>
    </form>
  );
}
