// Every visit e-mail renders to HTML and plain text from the shared layout, names the clinic,
// shows the time in the clinic's zone with the zone's name, and carries its key content.
import { createElement, type ReactElement } from "react";
import { describe, expect, it } from "vitest";
import AftercareEmail from "@/emails/aftercare";
import EmailChangeEmail from "@/emails/email-change";
import PatientInvitationEmail, { type PatientInvitationProps } from "@/emails/patient-invitation";
import ConsentCopyEmail from "@/emails/consent-copy";
import DepositReceiptEmail from "@/emails/deposit-receipt";
import ReminderEmail from "@/emails/reminder";
import SignInLinkEmail from "@/emails/sign-in-link";
import VisitConfirmedEmail from "@/emails/visit-confirmed";
import VisitEndedEmail from "@/emails/visit-ended";
import VisitMovedEmail from "@/emails/visit-moved";
import VisitRequestedEmail from "@/emails/visit-requested";
import type { VisitMailProps } from "@/emails/parts/visit-details";
import { visitWhen } from "@/lib/domain/visit-when";
import { emailTranslator } from "@/lib/i18n/email";
import { renderEmail } from "@/lib/mail/render";

const start = new Date("2027-03-15T14:00:00Z");
const props: VisitMailProps = {
  clinic: { name: "Harbourview Test Clinic", address: "9 Pier Lane, Testport", phone: "+1 555 0100" },
  patientName: "Ines Testperson",
  when: visitWhen(start, new Date(start.getTime() + 150 * 60_000), "America/Toronto"),
  toothWords: "lower left first molar",
  materialName: "Zirconia",
  lengthWords: "2 hours 30 minutes",
  visitUrl: "https://portal.example/patient",
};

const templates: [string, ReactElement, RegExp[]][] = [
  ["visit requested", createElement(VisitRequestedEmail, props), [/Nothing is booked until/]],
  ["visit confirmed", createElement(VisitConfirmedEmail, { ...props, reminderText: "48 hours and 2 hours before" }), [/is confirmed/i, /crown-visit\.ics/, /48 hours and 2 hours before/]],
  ["visit moved", createElement(VisitMovedEmail, { ...props, previous: visitWhen(new Date("2027-03-12T15:00:00Z"), new Date("2027-03-12T17:30:00Z"), "America/Toronto"), hasCalendar: true }), [/new time/i, /Friday 12 March 2027 at 10:00 \(Eastern Standard Time\)/]],
  ["visit declined", createElement(VisitEndedEmail, { ...props, outcome: "declined", reason: "The mill is being serviced that day.", hasCalendar: false }), [/could not be confirmed/i, /Reason given: The mill is being serviced/]],
  ["visit cancelled", createElement(VisitEndedEmail, { ...props, outcome: "cancelled", reason: null, hasCalendar: true }), [/is cancelled/i, /marks the visit as cancelled/]],
  ["reminder", createElement(ReminderEmail, { ...props, leadText: "in 2 days", turnOffUrl: "https://portal.example/reminders/t" }), [
    /Eat a normal meal beforehand/, /numb/, /Allow the whole visit: about 2 hours 30 minutes/, /list of the medicines/, /feel unwell/,
    /Turn off reminders for this visit/, /https:\/\/portal\.example\/reminders\/t/,
  ]],
  ["consent copy", createElement(ConsentCopyEmail, { ...props, filename: "consent-2027-03-15.pdf" }), [/consent-2027-03-15\.pdf/, /paper copy/]],
  ["deposit paid", createElement(DepositReceiptEmail, { ...props, kind: "paid", amountText: "$200.00", atText: "2027-03-01 09:12 EST", receiptNumber: "D-1A2B3C4D-P" }), [/received your deposit of \$200\.00/, /D-1A2B3C4D-P/, /plan's own decision prevails/]],
  ["deposit refunded", createElement(DepositReceiptEmail, { ...props, kind: "refunded", amountText: "$200.00", atText: "2027-03-02 10:00 EST", receiptNumber: "D-1A2B3C4D-R" }), [/refunded your deposit of \$200\.00 in full/, /D-1A2B3C4D-R/]],
  ["aftercare", createElement(AftercareEmail, props), [/Numbness/, /Sensitivity/, /Call the clinic on \+1 555 0100 if/, /emergency services/]],
];

describe("visit e-mail templates", () => {
  it.each(templates)("%s renders HTML and plain text with the clinic, its zone and its content", async (_name, element, content) => {
    const { html, text } = await renderEmail(element);
    expect(html).toMatch(/^<!DOCTYPE html/i);
    expect(html).toContain('lang="en"');
    for (const part of [html, text]) {
      expect(part).toContain("Harbourview Test Clinic");
      expect(part).toContain("9 Pier Lane, Testport");
      expect(part).toContain("dentist decides");
    }
    // No HTML in the plain-text part.
    expect(text).not.toMatch(/<\/?(div|table|td|p|a)\b/i);
    if (!/aftercare/.test(_name)) expect(text).toContain("Monday 15 March 2027, 10:00 to 12:30 (Eastern Daylight Time)");
    for (const c of content) expect(text).toMatch(c);
  });

  it("the sign-in link uses the same layout", async () => {
    const { html, text } = await renderEmail(createElement(SignInLinkEmail, { url: "https://portal.example/api/auth/callback/email?token=x" }));
    expect(html).toContain("https://portal.example/api/auth/callback/email?token=x");
    expect(text).toContain("dentist decides");
  });
});

describe("patient account e-mails", () => {
  const invitation: PatientInvitationProps = {
    url: "https://portal.example/api/auth/callback/email?token=x", patientName: "Ines Testperson",
    clinicName: "Harbourview Test Clinic", clinicAddress: "9 Pier Lane, Testport", clinicPhone: "+1 555 0100", hours: 72,
  };

  it("the invitation speaks English by default", async () => {
    const { html, text } = await renderEmail(createElement(PatientInvitationEmail, invitation));
    expect(html).toContain('lang="en"');
    expect(text).toContain("Hello Ines Testperson");
    expect(text).toContain("Open my Cuspal account");
    expect(text).toContain("stops working after 72 hours");
    expect(emailTranslator("en")("invitation.subject", { clinic: "Harbourview Test Clinic" })).toBe("Harbourview Test Clinic invites you to Cuspal");
  });

  it("the invitation to a French-speaking patient is French, subject included", async () => {
    const t = emailTranslator("fr");
    const { html, text } = await renderEmail(createElement(PatientInvitationEmail, { ...invitation, t }));
    expect(html).toContain('lang="fr"');
    expect(text).toContain("Harbourview Test Clinic vous a ouvert un compte Cuspal");
    expect(text).toContain("Ouvrir mon compte Cuspal");
    expect(text).toContain("cesse de fonctionner après 72 heures");
    expect(html).toContain("https://portal.example/api/auth/callback/email?token=x");
    const subject = t("invitation.subject", { clinic: "Harbourview Test Clinic" });
    expect(subject).toBe("Harbourview Test Clinic vous invite sur Cuspal");
    for (const english of ["invites you", "Open my Cuspal account", "Hello", "hours", "e-mail"]) {
      expect(text, english).not.toContain(english);
      expect(subject, english).not.toContain(english);
    }
  });

  it("the e-mail-change link speaks the patient's language", async () => {
    const url = "https://portal.example/api/me/email?token=abc";
    const en = await renderEmail(createElement(EmailChangeEmail, { url, hours: 24 }));
    expect(en.text).toContain("Use this address");
    expect(en.text).toContain("expires in 24 hours");
    const fr = await renderEmail(createElement(EmailChangeEmail, { url, hours: 24, t: emailTranslator("fr") }));
    expect(fr.html).toContain('lang="fr"');
    expect(fr.html).toContain(url);
    expect(fr.text).toContain("Utiliser cette adresse");
    expect(fr.text).toContain("expire dans 24 heures");
    expect(fr.text).not.toContain("Use this address");
    expect(emailTranslator("fr")("emailChange.subject")).toBe("Confirmez votre nouvelle adresse courriel pour Cuspal");
  });
});
