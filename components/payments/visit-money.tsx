// The money part of a visit page: fee, dental-plan estimate, deposit and balance. Shared by the
// patient's and the clinic's visit pages (staff read it in English); the actions differ by who is looking.
import { createTranslator } from "next-intl";
import type { ReactNode } from "react";
import type { getVisitMoney } from "@/lib/data/payments";
import { UNPAID_HOLD_MINUTES } from "@/lib/domain/money";
import { money, when } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locale";
import { messagesFor } from "@/lib/i18n/messages";

type Money = Awaited<ReturnType<typeof getVisitMoney>>["money"];

export function VisitMoney({ m, zone, locale = "en", children, returned }: { m: Money; zone: string; locale?: Locale; children?: ReactNode; returned?: boolean }) {
  const t = createTranslator({ locale, messages: messagesFor(locale), namespace: "payments" });
  const d = m.deposit;
  const cash = (cents: number, currency = m.currency) => money(cents, currency, locale);
  return (
    <section className="card space-y-3" aria-labelledby="money" data-testid="visit-money">
      <h2 id="money" className="text-lg font-semibold">{t("moneyHeading")}</h2>
      <dl className="grid grid-cols-[10rem_1fr] gap-y-1 text-sm">
        <dt className="text-ink-muted">{t("fee")}</dt><dd>{cash(m.feeCents)}</dd>
        {m.planShareEstimateCents !== null ? (
          <>
            <dt className="text-ink-muted">{t("planShare")}</dt><dd>{cash(m.planShareEstimateCents)}</dd>
            <dt className="text-ink-muted">{t("yourShare")}</dt><dd>{cash(m.patientShareCents)}</dd>
          </>
        ) : null}
        <dt className="text-ink-muted">{t("deposit")}</dt>
        <dd data-testid="deposit-status">{d.status === "none" ? t(`depositStatus.${d.status}`) : `${t(`depositStatus.${d.status}`)} · ${cash(d.amountCents, d.currency)}`}{d.paidAt ? ` · ${when(d.paidAt, zone, locale)}` : ""}</dd>
        {m.deskPayments.map((p) => (
          <div key={p.id} className="contents"><dt className="text-ink-muted">{t("paidAtDesk")}</dt><dd>{cash(p.amountCents, p.currency)} · {p.method}{p.reference ? ` · ${p.reference}` : ""}</dd></div>
        ))}
        <dt className="font-semibold">{t("balanceDue", { estimate: m.planShareEstimateCents !== null ? "yes" : "no" })}</dt><dd className="font-semibold" data-testid="balance-due">{cash(m.balanceDueCents)}</dd>
      </dl>
      {d.status === "due" && returned ? <p role="status" className="rounded-lg bg-harbour-50 p-3 text-sm">{t("waitingForPayment")}</p> : null}
      {d.status === "due" ? <p className="text-sm">{t("depositDue", { amount: cash(d.amountCents, d.currency), minutes: UNPAID_HOLD_MINUTES })}</p> : null}
      {children}
      {m.planShareEstimateCents !== null ? <p className="text-xs text-ink-soft">{t("planCaution")}</p> : null}
    </section>
  );
}
