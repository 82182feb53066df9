// The formatting module, the language choice and the French consent text.
import { describe, expect, it } from "vitest";
import { sha256Hex } from "@/lib/domain/consent-hash";
import { assembleConsent, consentText, crownWording, DEFAULT_SECTIONS, parseConsentText, SECTION_KEYS, type VisitSummary } from "@/lib/domain/consent-text";
import { DEFAULT_SECTIONS_FR, DEFAULT_TEMPLATE_TITLE_FR } from "@/lib/domain/consent-text-fr";
import { jurisdictionOf } from "@/lib/domain/jurisdiction";
import { formatClock, formatDateTime, formatDuration, formatLongDate, formatMoney } from "@/lib/i18n/format";
import { localeFromAcceptLanguage } from "@/lib/i18n/locale";
import { toothLabel, toothWords } from "@/lib/i18n/tooth-words";

const ZONE = "America/Toronto";

describe("dates in the clinic's zone, across the end of daylight saving (America/Toronto, 2026-11-01)", () => {
  // 05:30Z is 01:30 EDT (UTC−4), the first time that hour comes round; 06:30Z is 01:30 EST (UTC−5),
  // the second; 12:00Z is 07:00 EST. The reference is Intl.DateTimeFormat's own output for the
  // same options, written out beside each check, so a change of locale, zone or option shows.
  const instants = ["2026-10-31T16:00:00Z", "2026-11-01T05:30:00Z", "2026-11-01T06:30:00Z", "2026-11-01T12:00:00Z"].map((s) => new Date(s));
  const reference = (tag: string, opts: Intl.DateTimeFormatOptions, at: Date) => new Intl.DateTimeFormat(tag, { timeZone: ZONE, ...opts }).format(at);
  const full: Intl.DateTimeFormatOptions = { weekday: "short", day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZoneName: "short" };

  it("matches Intl.DateTimeFormat for en-CA and fr-CA at every instant", () => {
    for (const at of instants) {
      expect(formatDateTime(at, ZONE, "en")).toBe(reference("en-CA", full, at));
      expect(formatDateTime(at, ZONE, "fr")).toBe(reference("fr-CA", full, at));
      expect(formatLongDate(at, ZONE, "fr")).toBe(reference("fr-CA", { weekday: "long", day: "numeric", month: "long", year: "numeric" }, at));
    }
  });

  it("shows the repeated 01:30 once as daylight time and once as standard time", () => {
    // [M] from memory: Eastern time ends daylight saving on the first Sunday of November at 02:00 EDT.
    const [, first, second, morning] = instants;
    expect(formatClock(first, ZONE, "en")).toBe("01:30");
    expect(formatClock(second, ZONE, "en")).toBe("01:30");
    expect(formatDateTime(first, ZONE, "en")).toMatch(/EDT$/);
    expect(formatDateTime(second, ZONE, "en")).toMatch(/EST$/);
    expect(formatDateTime(first, ZONE, "fr")).toMatch(/HAE$/);
    expect(formatDateTime(second, ZONE, "fr")).toMatch(/HNE$/);
    expect(formatClock(morning, ZONE, "fr")).toBe("07 h 00");
    expect(formatLongDate(second, ZONE, "fr")).toBe("dimanche 1 novembre 2026");
  });

  it("formats money and durations in each language's own way", () => {
    expect(formatMoney(20000, "CAD", "en")).toBe(new Intl.NumberFormat("en-CA", { style: "currency", currency: "CAD" }).format(200));
    expect(formatMoney(145000, "CAD", "fr")).toBe(new Intl.NumberFormat("fr-CA", { style: "currency", currency: "CAD" }).format(1450));
    expect(formatMoney(145000, "CAD", "fr")).toMatch(/^1\s450,00\s\$$/);
    expect(formatDuration(167, "en")).toBe("2 h 47 min");
    expect(formatDuration(120, "fr")).toBe("2 h");
    expect(formatDuration(45, "fr")).toBe("45 min");
  });
});

describe("language from Accept-Language (RFC 9110 §12.5.4)", () => {
  it("takes the most wanted language we speak", () => {
    expect(localeFromAcceptLanguage("fr-CA,fr;q=0.9,en;q=0.8")).toBe("fr");
    expect(localeFromAcceptLanguage("en-US,en;q=0.9,fr;q=0.8")).toBe("en");
    expect(localeFromAcceptLanguage("de-DE,fr;q=0.5,en;q=0.4")).toBe("fr");
    expect(localeFromAcceptLanguage("en;q=0.2, fr;q=0.7")).toBe("fr");
    expect(localeFromAcceptLanguage("fr;q=0, en")).toBe("en");
    expect(localeFromAcceptLanguage("de, es")).toBeNull();
    expect(localeFromAcceptLanguage(undefined)).toBeNull();
  });
});

describe("teeth in words", () => {
  it("names teeth in French with the noun first", () => {
    expect(toothWords(36, "fr")).toBe("première molaire inférieure gauche");
    expect(toothWords(11, "fr")).toBe("incisive centrale supérieure droite");
    expect(toothWords(85, "fr")).toBe("deuxième molaire temporaire inférieure droite");
    expect(toothLabel(36, "fr")).toBe("36 (Universel 19) — première molaire inférieure gauche");
    expect(toothWords(36, "en")).toBe("lower left first molar");
  });
});

describe("the consent in French", () => {
  const facts: VisitSummary = {
    patient: "Zoë Łukasiewicz-Núñez", tooth: toothLabel(36, "fr"), material: "zircone", mode: "standard",
    date: "mercredi 10 mars 2027 à 8 h 00 HNE", fee: "1 450,00 $", clinic: "Studio dentaire de la Baie", dentist: "Dre Élodie Façon",
    materialClass: 5, dateOfBirth: "1985-04-12", length: "environ 2 h 15 min à 2 h 45 min", ...crownWording(false, "fr"),
  };
  const doc = assembleConsent({
    language: "fr", title: DEFAULT_TEMPLATE_TITLE_FR, templateVersion: 2, sections: DEFAULT_SECTIONS_FR, facts,
    materialCautions: ["Plus opaque que la vitrocéramique"], electronicRecords: jurisdictionOf("CA-ON").agreement.fr,
  });

  it("has the same sections and placeholders as the English default", () => {
    expect(DEFAULT_SECTIONS_FR.map((s) => s.key)).toEqual(DEFAULT_SECTIONS.map((s) => s.key));
    const placeholders = (s: { heading: string; body: string }) => [...`${s.heading} ${s.body}`.matchAll(/\{(\w+)\}/g)].map((m) => m[1]).sort();
    DEFAULT_SECTIONS.forEach((s, i) => expect(placeholders(DEFAULT_SECTIONS_FR[i]), s.key).toEqual(placeholders(s)));
  });

  it("reads back from its canonical text, accents intact, with its language", () => {
    const text = consentText(doc);
    expect(text).toContain("## Votre rendez-vous");
    expect(text).toContain("Texte de consentement, version 2");
    expect(text).toContain("Loi de 2000 sur le commerce électronique");
    expect(text).toMatch(/façonne la dent/);
    const back = parseConsentText(text);
    expect(back.language).toBe("fr");
    expect(back.sections.map((s) => s.key)).toEqual([...SECTION_KEYS]);
    expect(consentText(back)).toBe(text);
    // The fingerprint is of exactly this text: the English one differs.
    const english = consentText({ ...doc, language: "en" });
    expect(sha256Hex(english)).not.toBe(sha256Hex(text));
  });

  it("follows the jurisdiction: Ontario cites its own law, the United States the ESIGN Act", () => {
    expect(jurisdictionOf("CA-ON").agreement.en.text.join(" ")).toMatch(/Electronic Commerce Act, 2000/);
    expect(jurisdictionOf("US").agreement.en.text.join(" ")).toMatch(/15 U\.S\.C\. 7001\(c\)/);
    expect(jurisdictionOf("CA-ON").agreement.en.text.join(" ")).not.toMatch(/U\.S\.C\./);
    expect(jurisdictionOf("nowhere").code).toBe("CA-ON");
  });
});

describe("the default catalogue in French", () => {
  it("gives every material a French name, description, pros and cautions, item for item", async () => {
    const { CATALOGUE } = await import("@/db/seed/catalogue");
    const { CATALOGUE_FR } = await import("@/db/seed/catalogue-fr");
    for (const m of CATALOGUE) {
      const fr = CATALOGUE_FR[m.key];
      expect(fr, m.key).toBeDefined();
      expect(fr.pros.length, m.key).toBe(m.pros.length);
      expect(fr.cautions.length, m.key).toBe(m.cautions.length);
      expect(fr.description).not.toBe(m.description);
    }
  });
});
