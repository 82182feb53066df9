"use client";
// Loaded with the plan form when the patient opens it: the message provider's code comes with it,
// not with the page.
import { NextIntlClientProvider, type AbstractIntlMessages } from "next-intl";
import { PlanEstimateForm } from "./plan-estimate-form";

type Props = React.ComponentProps<typeof PlanEstimateForm> & { locale: string; timeZone: string; messages: AbstractIntlMessages };

export default function PlanEstimateLazy({ locale, timeZone, messages, ...form }: Props) {
  return (
    <NextIntlClientProvider locale={locale} timeZone={timeZone} messages={messages}>
      <PlanEstimateForm {...form} />
    </NextIntlClientProvider>
  );
}
