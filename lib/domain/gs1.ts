// GS1 element strings from a crown block's package: GTIN (01), lot (10), expiry (17), serial (21)
// and production date (11), in the printed form "(01)…(17)…(10)…" or the scanned form where
// ASCII 29 (GS) stands for FNC1 after a variable-length field. Pure; no clock of its own.

export type Gs1Fields = {
  gtin?: string;
  lot?: string;
  /** YYYY-MM-DD (21 CFR 801.18 date form); a DD of 00 becomes the month's last day. */
  expiry?: string;
  serial?: string;
  productionDate?: string;
};

export type Gs1ErrorCode = "malformed" | "check_digit" | "unsupported" | "expired" | "no_lot";

export class Gs1Error extends Error {
  constructor(
    readonly code: Gs1ErrorCode,
    message: string,
  ) {
    super(message);
    this.name = "Gs1Error";
  }
}

export const GROUP_SEPARATOR = "\u001d";

type AiSpec = { field: keyof Gs1Fields; name: string } & ({ fixed: number } | { max: number });

/** The AIs a block package carries that Cuspal reads. Lengths from the GS1 General Specifications AI table. */
const AIS: Record<string, AiSpec> = {
  "01": { field: "gtin", name: "GTIN (01)", fixed: 14 },
  "10": { field: "lot", name: "lot (10)", max: 20 },
  "11": { field: "productionDate", name: "production date (11)", fixed: 6 },
  "17": { field: "expiry", name: "expiry date (17)", fixed: 6 },
  "21": { field: "serial", name: "serial number (21)", max: 20 },
};

/** GS1 "character set 82": the characters allowed in alphanumeric AIs such as lot and serial. */
const CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]+$/;

/** Check digit over the data digits: weights 3,1,3,… from the rightmost digit; (10 − sum mod 10) mod 10. */
export function gs1CheckDigit(data: string): number {
  if (!/^\d+$/.test(data)) throw new Gs1Error("malformed", "A GS1 number has digits only.");
  let sum = 0;
  for (let i = 0; i < data.length; i++) {
    const digit = data.charCodeAt(data.length - 1 - i) - 48;
    sum += digit * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** True for a GTIN-8/12/13/14 whose last digit is the right check digit. */
export function isValidGtin(gtin: string): boolean {
  if (!/^(\d{8}|\d{12}|\d{13}|\d{14})$/.test(gtin)) return false;
  return gs1CheckDigit(gtin.slice(0, -1)) === Number(gtin.at(-1));
}

/** YYMMDD to YYYY-MM-DD. The century is the one nearest to `today` (GS1's sliding window:
 *  up to 49 years ahead, otherwise the past); DD = 00 means the last day of the month. */
export function gs1Date(yymmdd: string, today: string, what = "date"): string {
  if (!/^\d{6}$/.test(yymmdd)) throw new Gs1Error("malformed", `The ${what} must be six digits, YYMMDD.`);
  const yy = Number(yymmdd.slice(0, 2));
  const mm = Number(yymmdd.slice(2, 4));
  const dd = Number(yymmdd.slice(4, 6));
  const currentYear = Number(today.slice(0, 4));
  const currentCentury = Math.floor(currentYear / 100) * 100;
  const diff = yy - (currentYear % 100);
  const century = diff >= 51 ? currentCentury - 100 : diff <= -50 ? currentCentury + 100 : currentCentury;
  const year = century + yy;
  if (mm < 1 || mm > 12) throw new Gs1Error("malformed", `The ${what} has no month ${String(mm).padStart(2, "0")}.`);
  const lastDay = new Date(Date.UTC(year, mm, 0)).getUTCDate();
  if (dd > lastDay) throw new Gs1Error("malformed", `The ${what} has a day that does not exist in that month.`);
  const day = dd === 0 ? lastDay : dd;
  return `${year}-${String(mm).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
}

/** Splits either form into [AI, value] pairs without judging the values. */
function split(input: string): [string, string][] {
  const text = input.trim();
  if (text.startsWith("(")) {
    // Printed form: spaces are not part of any value, people type them between elements.
    const compact = text.replace(/\s+/g, "");
    const pairs: [string, string][] = [];
    const re = /\((\d{2,4})\)/g;
    const marks = [...compact.matchAll(re)];
    if (marks.length === 0 || marks[0].index !== 0) throw new Gs1Error("malformed", "The code must start with an AI in brackets, like (01).");
    for (const [i, m] of marks.entries()) {
      const from = m.index! + m[0].length;
      const to = i + 1 < marks.length ? marks[i + 1].index! : compact.length;
      // The printed form shows where each field ends, so AIs Cuspal does not read are skipped.
      if (m[1] in AIS) pairs.push([m[1], compact.slice(from, to)]);
    }
    if (pairs.length === 0) throw new Gs1Error("unsupported", "The code holds none of GTIN (01), lot (10), expiry (17) or serial (21). Type the lot by hand.");
    return pairs;
  }

  // Scanned form: an optional symbology identifier (]C1, ]d2, ]Q3, ]e0) and a leading FNC1.
  let rest = text.replace(/^\][A-Za-z]\d/, "");
  while (rest.startsWith(GROUP_SEPARATOR)) rest = rest.slice(1);
  if (!rest) throw new Gs1Error("malformed", "The code is empty.");
  const pairs: [string, string][] = [];
  while (rest.length > 0) {
    const ai = rest.slice(0, 2);
    const spec = AIS[ai];
    if (!/^\d{2}$/.test(ai)) throw new Gs1Error("malformed", "The code is not a GS1 element string: an AI must be digits.");
    if (!spec) throw new Gs1Error("unsupported", `The code holds AI (${ai}), which Cuspal does not read. Type the lot by hand instead.`);
    rest = rest.slice(2);
    if ("fixed" in spec) {
      pairs.push([ai, rest.slice(0, spec.fixed)]);
      rest = rest.slice(spec.fixed);
      // A separator after a fixed-length field is allowed and ignored.
      if (rest.startsWith(GROUP_SEPARATOR)) rest = rest.slice(1);
    } else {
      const end = rest.indexOf(GROUP_SEPARATOR);
      pairs.push([ai, end === -1 ? rest : rest.slice(0, end)]);
      rest = end === -1 ? "" : rest.slice(end + 1);
    }
  }
  return pairs;
}

/** Parses and checks a GS1 element string; `today` (YYYY-MM-DD) sets the century of two-digit years. */
export function parseElementString(input: string, today: string): Gs1Fields {
  if (typeof input !== "string" || input.trim() === "") throw new Gs1Error("malformed", "Scan or type the code from the block's package.");
  const fields: Gs1Fields = {};
  for (const [ai, value] of split(input)) {
    const spec = AIS[ai];
    if (!spec) throw new Gs1Error("unsupported", `The code holds AI (${ai}), which Cuspal does not read. Type the lot by hand instead.`);
    if (fields[spec.field] !== undefined) throw new Gs1Error("malformed", `The ${spec.name} appears twice in the code.`);
    if ("fixed" in spec) {
      if (value.length !== spec.fixed || !/^\d+$/.test(value)) {
        throw new Gs1Error("malformed", `The ${spec.name} must be exactly ${spec.fixed} digits.`);
      }
    } else {
      if (value.length === 0) throw new Gs1Error("malformed", `The ${spec.name} is empty.`);
      if (value.length > spec.max) throw new Gs1Error("malformed", `The ${spec.name} is longer than ${spec.max} characters; a separator may be missing.`);
      if (!CSET82.test(value)) throw new Gs1Error("malformed", `The ${spec.name} holds a character GS1 does not allow.`);
    }
    if (spec.field === "gtin") {
      if (!isValidGtin(value)) {
        throw new Gs1Error("check_digit", `The GTIN ${value} has a wrong check digit (expected ${gs1CheckDigit(value.slice(0, -1))}). Scan it again or type the lot by hand.`);
      }
      fields.gtin = value;
    } else if (spec.field === "expiry" || spec.field === "productionDate") {
      fields[spec.field] = gs1Date(value, today, spec.name);
    } else {
      fields[spec.field] = value;
    }
  }
  return fields;
}

/** A block may be used up to and including its expiry date. */
export function isExpired(expiry: string, today: string): boolean {
  return expiry < today;
}

/** Parses a package code for recording on a visit: it must name a lot and not be expired. */
export function readBlockCode(input: string, today: string): Gs1Fields & { lot: string } {
  const fields = parseElementString(input, today);
  if (fields.expiry && isExpired(fields.expiry, today)) {
    throw new Gs1Error("expired", `This block expired on ${fields.expiry}. Do not use it; take a block within its date.`);
  }
  if (!fields.lot) throw new Gs1Error("no_lot", "The code has no lot number (10). Type the lot by hand.");
  return { ...fields, lot: fields.lot };
}

/** A lot typed by hand: trimmed, 1–20 characters of GS1's character set. */
export function normaliseLot(lot: string): string {
  const value = lot.trim();
  if (!value) throw new Gs1Error("malformed", "Type the lot number.");
  if (value.length > 20) throw new Gs1Error("malformed", "A lot number has at most 20 characters.");
  if (!CSET82.test(value)) throw new Gs1Error("malformed", "A lot number has letters, digits and a few signs such as - . / only, without spaces.");
  return value;
}
