"use client";

// Upload form for documents: from the camera or from files, with progress (XMLHttpRequest, as
// fetch cannot report upload progress) and a retry that resends the same file.
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import {
  ACCEPT_ATTRIBUTE, DOCUMENT_KINDS, MAX_DOCUMENT_BYTES, megabytesRoundedUp, type DocumentKind,
} from "@/lib/domain/documents";
import { documentFieldsSchema, TITLE_MAX } from "@/lib/documents/schema";
import { INTL_TAG, isLocale } from "@/lib/i18n/locale";
import { useSizeWords } from "./size-words";

type Input = z.input<typeof documentFieldsSchema>;
type Output = z.output<typeof documentFieldsSchema>;
type Attempt = { values: Output; file: File };
type State =
  | { step: "idle" }
  | { step: "sending"; percent: number | null }
  | { step: "failed"; message: string; retry: Attempt | null }
  | { step: "done"; title: string };

const pickerClass =
  "btn-quiet cursor-pointer has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-harbour-600";

export function DocumentUpload({ kinds, patientId }: { kinds: DocumentKind[]; patientId?: string }) {
  // Staff pages render in English (i18n/request.ts), so there these words stay English.
  const t = useTranslations("documentUpload");
  const tl = useTranslations("documentList");
  const sizeWords = useSizeWords();
  const kindLabel = (k: string) => ((DOCUMENT_KINDS as readonly string[]).includes(k) ? tl(`kinds.${k}`) : "");
  const locale = useLocale();
  const oneDecimal = new Intl.NumberFormat(INTL_TAG[isLocale(locale) ? locale : "en"], { minimumFractionDigits: 1, maximumFractionDigits: 1, useGrouping: false });
  const tooLarge = (bytes: number) => t("tooLarge", { size: oneDecimal.format(megabytesRoundedUp(bytes)) });
  const router = useRouter();
  const ids = useId();
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const [state, setState] = useState<State>({ step: "idle" });

  const { register, handleSubmit, setValue, getValues, setError, reset, formState: { errors } } = useForm<Input, unknown, Output>({
    resolver: zodResolver(documentFieldsSchema),
    defaultValues: { kind: "" as DocumentKind, title: "", patientId },
  });

  const kindField = register("kind", {
    onChange: (e: React.ChangeEvent<HTMLSelectElement>) => {
      // Offer the kind's name as the title until the person types their own.
      const title = getValues("title").trim();
      const previous = DOCUMENT_KINDS.map(kindLabel);
      if (!title || previous.includes(title)) setValue("title", kindLabel(e.target.value));
    },
  });

  function choose(e: React.ChangeEvent<HTMLInputElement>) {
    const chosen = e.target.files?.[0] ?? null;
    e.target.value = "";
    setState({ step: "idle" });
    if (!chosen) return;
    setFile(chosen);
    setFileError(chosen.size > MAX_DOCUMENT_BYTES ? tooLarge(chosen.size) : null);
  }

  function send(attempt: Attempt) {
    const { values, file: toSend } = attempt;
    const body = new FormData();
    body.set("kind", values.kind);
    body.set("title", values.title);
    if (values.patientId) body.set("patientId", values.patientId);
    body.set("file", toSend, toSend.name);

    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/documents");
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => setState({ step: "sending", percent: e.lengthComputable ? Math.round((e.loaded / e.total) * 100) : null });
    xhr.onload = () => {
      if (xhr.status === 201) {
        setState({ step: "done", title: values.title });
        setFile(null);
        reset({ kind: "" as DocumentKind, title: "", patientId });
        router.refresh();
        return;
      }
      const res = (xhr.response ?? {}) as { error?: string; field?: string };
      const message = res.error ?? t("failed");
      if (res.field === "kind" || res.field === "title") setError(res.field, { message });
      if (res.field === "file") setFileError(message);
      const retryable = xhr.status >= 500 || xhr.status === 408 || xhr.status === 429;
      setState({ step: "failed", message, retry: retryable ? attempt : null });
    };
    xhr.onerror = xhr.ontimeout = () =>
      setState({ step: "failed", message: t("offline"), retry: attempt });
    setState({ step: "sending", percent: 0 });
    xhr.send(body);
  }

  const submit = handleSubmit((values) => {
    if (!file) return setFileError(t("noFileError"));
    if (file.size > MAX_DOCUMENT_BYTES) return setFileError(tooLarge(file.size));
    send({ values, file });
  });

  const sending = state.step === "sending";
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-describedby={`${ids}-rules`}>
      <p id={`${ids}-rules`} className="text-sm text-ink-soft">
        {t("rules")}
      </p>

      <div>
        <label htmlFor={`${ids}-kind`} className="field-label">{t("kind")}</label>
        <select id={`${ids}-kind`} className="field-input" aria-invalid={!!errors.kind} aria-describedby={errors.kind ? `${ids}-kind-error` : undefined} {...kindField}>
          <option value="">{t("choose")}</option>
          {kinds.map((k) => <option key={k} value={k}>{kindLabel(k)}</option>)}
        </select>
        {errors.kind ? <p id={`${ids}-kind-error`} className="field-error">{errors.kind.message}</p> : null}
      </div>

      <div>
        <label htmlFor={`${ids}-title`} className="field-label">{t("title")}</label>
        <input id={`${ids}-title`} className="field-input" maxLength={TITLE_MAX} autoComplete="off"
          aria-invalid={!!errors.title} aria-describedby={errors.title ? `${ids}-title-error` : undefined} {...register("title")} />
        {errors.title ? <p id={`${ids}-title-error`} className="field-error">{errors.title.message}</p> : null}
      </div>

      <fieldset aria-describedby={fileError ? `${ids}-file-error` : undefined}>
        <legend className="field-label">{t("file")}</legend>
        <div className="flex flex-wrap gap-2">
          <label className={pickerClass}>
            <input type="file" accept="image/*" capture="environment" className="sr-only" onChange={choose} disabled={sending} />
            {t("takePhoto")}
          </label>
          <label className={pickerClass}>
            <input type="file" accept={ACCEPT_ATTRIBUTE} className="sr-only" onChange={choose} disabled={sending} />
            {t("chooseFile")}
          </label>
        </div>
        <p className="mt-2 text-sm text-ink-soft" aria-live="polite" data-testid="chosen-file">
          {file ? t.rich("chosen", { size: sizeWords(file.size), name: () => <span className="font-semibold break-all">{file.name}</span> }) : t("noFile")}
        </p>
        {fileError ? <p id={`${ids}-file-error`} className="field-error" role="alert" data-testid="file-error">{fileError}</p> : null}
      </fieldset>

      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn-primary" disabled={sending}>{sending ? t("uploading") : t("upload")}</button>
        {state.step === "failed" && state.retry ? (
          <button type="button" className="btn-quiet" onClick={() => state.retry && send(state.retry)}>{t("tryAgain")}</button>
        ) : null}
      </div>

      {sending ? (
        <div className="space-y-1">
          <label htmlFor={`${ids}-progress`} className="text-sm font-semibold">
            {t("progress", { percent: state.percent === null ? "unknown" : String(state.percent) })}
          </label>
          <progress
            id={`${ids}-progress`}
            className="block h-3 w-full overflow-hidden rounded-full [&::-moz-progress-bar]:bg-harbour-600 [&::-webkit-progress-bar]:bg-paper-deep [&::-webkit-progress-value]:bg-harbour-600"
            max={100}
            value={state.percent ?? undefined}
          />
        </div>
      ) : null}
      <div aria-live="polite">
        {state.step === "done" ? <p className="font-semibold text-sage-700" data-testid="upload-done">{t("done", { title: state.title })}</p> : null}
      </div>
      {state.step === "failed" && !fileError && !errors.kind && !errors.title ? (
        <p className="field-error" role="alert" data-testid="upload-error">{state.message}</p>
      ) : null}
    </form>
  );
}
