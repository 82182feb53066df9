"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import type SignatureCanvas from "react-signature-canvas";
import { SectionBody, VisitRows } from "@/components/consent/consent-document";
import { ANSWERS, QUESTIONS, type Question } from "@/lib/domain/consent-questionnaire";
import { consentFormSchema, type ConsentFormInput, type ConsentFormValues } from "@/lib/domain/consent-schemas";
import type { AssembledConsent } from "@/lib/domain/consent-text";
import { checkDrawnSignature, SignaturePad } from "./signature-pad";

type Props = { appointmentId: string; templateId: string; textSha256: string; document: AssembledConsent; patientName: string };

const STEPS = ["stepHealth", "stepRead", "stepSign"] as const;
const GROUPS = [...new Set(QUESTIONS.map((q) => q.group))];

// The shared schema's messages are English; the form shows the catalogue's sentence for each.
const ERROR_KEYS: Record<string, "chooseAnswer" | "tickEvery" | "agreeRecords" | "typeName" | "nameTooLong"> = {
  "Choose an answer.": "chooseAnswer",
  "Please read and tick every section before signing.": "tickEvery",
  "Please agree to sign and receive records electronically, or ask the clinic for paper.": "agreeRecords",
  "Type your full name.": "typeName",
  "That name is too long.": "nameTooLong",
};

/** Questionnaire → read and tick each section → agree to e-records, type name, draw signature → sign. */
export function ConsentFlow({ appointmentId, templateId, textSha256, document, patientName }: Props) {
  const router = useRouter();
  const t = useTranslations("consent");
  const tq = useTranslations("questionnaire");
  const tc = useTranslations("common");
  const te = useTranslations("consentErrors");
  const say = (message: string | undefined) => {
    if (!message) return message;
    const key = ERROR_KEYS[message];
    if (key) return te(key);
    const max = message.match(/^Keep this under (\d+) characters\.$/);
    return max ? te("tooLong", { max: Number(max[1]) }) : message;
  };
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
    // The rule's own sentences are English; the patient reads the catalogue's.
    setSignatureError(problem ? t(!pad.current || pad.current.isEmpty() ? "emptySignature" : "signatureTooSmall") : null);
    if (problem) return;
    let res: Response;
    try {
      res = await fetch("/api/consents", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ ...values, appointmentId, templateId, textSha256, signature: pad.current!.toDataURL("image/png") }),
      });
    } catch {
      setServerError({ message: t("unreachable"), reload: false });
      return;
    }
    if (res.status === 201) {
      setDone(true);
      router.refresh();
      return;
    }
    const body: { error?: string; field?: string } = await res.json().catch(() => ({}));
    const message = body.error ?? t("signFailed");
    if (body.field === "signature") setSignatureError(message);
    else if (body.field === "typedName") setError("typedName", { message }, { shouldFocus: true });
    else setServerError({ message, reload: body.field === "templateId" || body.field === "textSha256" });
  }

  if (done) {
    return (
      <p role="status" className="card font-semibold" data-testid="consent-signed">
        {t("thanks")}
      </p>
    );
  }

  const answerError = (q: Question) => say(errors.answers?.[q.key]?.message);

  return (
    <form onSubmit={(e) => void handleSubmit(sign)(e)} noValidate className="space-y-5" aria-describedby="consent-steps">
      <ol id="consent-steps" className="flex gap-2 text-sm" aria-label={t("steps")}>
        {STEPS.map((label, i) => (
          <li key={label} aria-current={i === step ? "step" : undefined}
            className={`flex-1 rounded-md border px-2 py-1 text-center ${i === step ? "border-harbour-600 bg-harbour-50 font-semibold text-harbour-800" : i < step ? "border-line bg-white text-ink-soft" : "border-line text-ink-muted"}`}>
            {i + 1}. {t(label)}
          </li>
        ))}
      </ol>
      <h2 ref={heading} tabIndex={-1} className="text-xl font-semibold outline-none">
        {t("stepHeading", { step: step + 1, total: STEPS.length, label: t(STEPS[step]) })}
      </h2>

      <div hidden={step !== 0} className="space-y-5">
        <p>{t("healthIntro")}</p>
        {GROUPS.map((group) => (
          <section key={group} className="card space-y-4" aria-labelledby={`group-${group}`}>
            <h3 id={`group-${group}`} className="text-lg font-semibold">{tq(`groups.${group}`)}</h3>
            {QUESTIONS.filter((q) => q.group === group).map((q) => (
              <fieldset key={q.key} aria-describedby={answerError(q) ? `${q.key}-error` : undefined} data-testid={`question-${q.key}`}>
                <legend className="mb-1 font-medium">{tq(`questions.${q.key}`)}</legend>
                {tq.has(`hints.${q.key}`) ? <p className="mb-1 text-sm text-ink-soft">{tq(`hints.${q.key}`)}</p> : null}
                <div className="flex flex-wrap gap-2">
                  {ANSWERS.map((a) => (
                    <label key={a} className="inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-ink-muted bg-white px-3 has-[:checked]:border-harbour-600 has-[:checked]:bg-harbour-50 has-[:checked]:font-semibold">
                      <input type="radio" value={a} className="size-5 accent-harbour-600" {...register(`answers.${q.key}`, { onChange: () => clearErrors(`answers.${q.key}`) })} />
                      {tq(`answers.${a}`)}
                    </label>
                  ))}
                </div>
                {answerError(q) ? <p id={`${q.key}-error`} className="field-error">{answerError(q)}</p> : null}
              </fieldset>
            ))}
          </section>
        ))}
        <section className="card space-y-4" aria-labelledby="group-more">
          <h3 id="group-more" className="text-lg font-semibold">{t("ownWords")}</h3>
          <div>
            <label htmlFor="otherAllergies" className="field-label">{t("otherAllergies")}</label>
            <textarea id="otherAllergies" rows={2} className="field-input" {...register("answers.otherAllergies")} />
            {errors.answers?.otherAllergies ? <p className="field-error">{say(errors.answers.otherAllergies.message)}</p> : null}
          </div>
          <div>
            <label htmlFor="medicines" className="field-label">{t("medicines")}</label>
            <textarea id="medicines" rows={2} className="field-input" {...register("answers.medicines")} />
          </div>
          <div>
            <label htmlFor="notes" className="field-label">{t("notes")}</label>
            <textarea id="notes" rows={2} className="field-input" {...register("answers.notes")} />
          </div>
        </section>
        <button type="button" className="btn-primary w-full" onClick={next}>{t("toConsent")}</button>
      </div>

      <div hidden={step !== 1} className="space-y-4">
        <p>{t("readIntro")}</p>
        <section className="card space-y-2" aria-labelledby="visit-heading">
          <h3 id="visit-heading" className="text-lg font-semibold">{t("yourVisit")}</h3>
          <VisitRows rows={document.visit} />
        </section>
        {document.sections.map((s) => (
          <section key={s.key} className="card space-y-3" aria-labelledby={`section-${s.key}`} data-testid={`section-${s.key}`}>
            <h3 id={`section-${s.key}`} className="text-lg font-semibold">{s.heading}</h3>
            <SectionBody section={s} />
            <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg bg-paper p-2 font-medium">
              <input type="checkbox" value={s.key} className="size-6 accent-harbour-600" {...register("acknowledged", { onChange: () => { if (errors.acknowledged) void trigger("acknowledged"); } })} />
              {t("understood")}
            </label>
          </section>
        ))}
        {errors.acknowledged ? <p className="field-error" role="alert">{say(errors.acknowledged.message ?? errors.acknowledged.root?.message)}</p> : null}
        <div className="flex gap-2">
          <button type="button" className="btn-quiet" onClick={() => setStep(0)}>{tc("back")}</button>
          <button type="button" className="btn-primary flex-1" onClick={next}>{t("toSigning")}</button>
        </div>
      </div>

      <div hidden={step !== 2} className="space-y-4">
        {serverError ? (
          <div role="alert" className="rounded-lg bg-clay-50 p-3 text-clay-700" data-testid="sign-error">
            <p className="font-medium">{serverError.message}</p>
            {serverError.reload ? <button type="button" className="btn-quiet mt-2" onClick={() => window.location.reload()}>{t("reload")}</button> : null}
          </div>
        ) : null}
        <section className="card space-y-2" aria-labelledby="records-heading">
          <h3 id="records-heading" className="text-lg font-semibold">{document.electronicRecords.heading}</h3>
          {document.electronicRecords.text.map((t) => <p key={t}>{t}</p>)}
          <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg bg-paper p-2 font-medium">
            <input type="checkbox" className="size-6 accent-harbour-600" aria-describedby={errors.electronicRecords ? "records-error" : undefined} {...register("electronicRecords", { onChange: () => clearErrors("electronicRecords") })} />
            {t("agreeRecords")}
          </label>
          {errors.electronicRecords ? <p id="records-error" className="field-error">{say(errors.electronicRecords.message)}</p> : null}
        </section>
        <section className="card space-y-4" aria-labelledby="sign-heading">
          <h3 id="sign-heading" className="text-lg font-semibold">{t("signature")}</h3>
          <p>{t("signatureIntro")}</p>
          <div>
            <label htmlFor="typedName" className="field-label">{t("typeName")}</label>
            <p id="typedName-hint" className="mb-1 text-sm text-ink-soft">{t("asClinicHasIt", { name: patientName })}</p>
            <input id="typedName" autoComplete="name" className="field-input" aria-invalid={!!errors.typedName}
              aria-describedby={errors.typedName ? "typedName-hint typedName-error" : "typedName-hint"} {...register("typedName")} />
            {errors.typedName ? <p id="typedName-error" className="field-error">{say(errors.typedName.message)}</p> : null}
          </div>
          {/* Mounted only when visible: the canvas takes its pixel size from its box when it mounts. */}
          {step === 2 ? <SignaturePad padRef={pad} error={signatureError} onChange={() => setSignatureError(null)} /> : null}
        </section>
        <div className="flex gap-2">
          <button type="button" className="btn-quiet" onClick={() => setStep(1)}>{tc("back")}</button>
          <button type="submit" className="btn-primary flex-1" disabled={isSubmitting}>{isSubmitting ? t("signing") : t("sign")}</button>
        </div>
      </div>
    </form>
  );
}
