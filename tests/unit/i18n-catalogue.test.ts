// The message catalogues: every key in both languages with the same ICU arguments, read by the
// ICU MessageFormat parser next-intl itself uses; plural messages cover each language's CLDR
// categories, as Intl.PluralRules (which carries the CLDR data) lists them.
import { parse, TYPE, type MessageFormatElement } from "@formatjs/icu-messageformat-parser";
import { createTranslator } from "next-intl";
import { describe, expect, it } from "vitest";
import en from "@/messages/en.json";
import fr from "@/messages/fr.json";

type Tree = { [key: string]: string | Tree };

function flatten(tree: Tree, prefix = ""): Map<string, string> {
  const out = new Map<string, string>();
  for (const [k, v] of Object.entries(tree)) {
    const key = prefix ? `${prefix}.${k}` : k;
    if (typeof v === "string") out.set(key, v);
    else for (const [kk, vv] of flatten(v, key)) out.set(kk, vv);
  }
  return out;
}

/** Each argument with its kind ("argument", "plural", "select", …), and every plural element. */
function argumentsOf(elements: MessageFormatElement[], args = new Set<string>(), plurals: { name: string; options: string[] }[] = []) {
  for (const el of elements) {
    if (el.type === TYPE.argument) args.add(`${el.value}:argument`);
    if (el.type === TYPE.number) args.add(`${el.value}:number`);
    if (el.type === TYPE.date || el.type === TYPE.time) args.add(`${el.value}:date`);
    if (el.type === TYPE.select || el.type === TYPE.plural) {
      args.add(`${el.value}:${el.type === TYPE.plural ? "plural" : "select"}`);
      if (el.type === TYPE.plural) plurals.push({ name: el.value, options: Object.keys(el.options) });
      for (const opt of Object.values(el.options)) argumentsOf(opt.value, args, plurals);
    }
    if (el.type === TYPE.tag) argumentsOf(el.children, args, plurals);
  }
  return { args, plurals };
}

const EN = flatten(en as Tree);
const FR = flatten(fr as Tree);

describe("message catalogues", () => {
  it("hold the same keys in English and French", () => {
    expect([...FR.keys()].sort()).toEqual([...EN.keys()].sort());
    for (const [key, value] of FR) expect(value.trim(), key).not.toBe("");
  });

  it("give each message the same ICU arguments in both languages", () => {
    for (const [key, enText] of EN) {
      const a = argumentsOf(parse(enText));
      const b = argumentsOf(parse(FR.get(key)!));
      expect([...b.args].sort(), key).toEqual([...a.args].sort());
    }
  });

  it("cover every CLDR plural category of the language in each plural message", () => {
    for (const [locale, messages] of [["en", EN], ["fr", FR]] as const) {
      // [P] Unicode CLDR plural rules, through Intl.PluralRules: the categories each language uses.
      const categories = new Intl.PluralRules(locale).resolvedOptions().pluralCategories;
      let plurals = 0;
      for (const [key, text] of messages) {
        for (const p of argumentsOf(parse(text)).plurals) {
          plurals++;
          for (const c of categories) expect(p.options, `${locale} ${key}`).toContain(c);
        }
      }
      expect(plurals).toBeGreaterThan(5);
    }
  });
});

describe("plural forms against CLDR", () => {
  it("Intl.PluralRules knows English one/other and French one/many/other", () => {
    // [P] Unicode CLDR plural rules: English has one/other, 0 and 1.5 are "other";
    // French has one/many/other, 0 and 1.5 are "one", 1,000,000 is "many".
    const enRules = new Intl.PluralRules("en");
    const frRules = new Intl.PluralRules("fr");
    expect([...enRules.resolvedOptions().pluralCategories].sort()).toEqual(["one", "other"]);
    expect([...frRules.resolvedOptions().pluralCategories].sort()).toEqual(["many", "one", "other"]);
    expect([enRules.select(0), enRules.select(1), enRules.select(1.5), enRules.select(2)]).toEqual(["other", "one", "other", "other"]);
    expect([frRules.select(0), frRules.select(1), frRules.select(1.5), frRules.select(2), frRules.select(1_000_000)]).toEqual(["one", "one", "one", "other", "many"]);
  });

  it("renders our plural messages in the category CLDR gives each number", () => {
    const tEn = createTranslator({ locale: "en", messages: en, namespace: "email" });
    const tFr = createTranslator({ locale: "fr", messages: fr, namespace: "email" });
    // English: 0 and 1.5 take the "other" form, 1 the "one" form.
    expect(tEn("hours", { count: 0 })).toBe("0 hours");
    expect(tEn("hours", { count: 1 })).toBe("1 hour");
    expect(tEn("hours", { count: 1.5 })).toBe("1.5 hours");
    // French: 0 and 1.5 take the singular ("one"); a million takes "many" (written here like "other").
    expect(tFr("hours", { count: 0 })).toBe("0 heure");
    expect(tFr("hours", { count: 1.5 })).toBe("1,5 heure");
    expect(tFr("hours", { count: 2 })).toBe("2 heures");
    expect(tFr("hours", { count: 1_000_000 })).toMatch(/^1\s000\s000 heures$/);
  });
});
