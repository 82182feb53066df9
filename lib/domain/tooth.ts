// Tooth notation: ISO 3950 two-digit (FDI) ⇄ Universal numbering ⇄ plain words, with the tooth class.
// Pure functions; invalid input throws ToothError with a sentence a person can act on.
import type { ToothClass } from "./types";

export class ToothError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ToothError";
  }
}

export type Tooth = {
  fdi: number;
  universal: string; // "1"–"32" for permanent teeth, "A"–"T" for primary teeth
  primary: boolean;
  quadrant: 1 | 2 | 3 | 4; // 1 upper right, 2 upper left, 3 lower left, 4 lower right (patient's own sides)
  position: number;
  toothClass: ToothClass;
  words: string;
};

const SIDES = ["upper right", "upper left", "lower left", "lower right"] as const;
const PERMANENT_NAMES = ["central incisor", "lateral incisor", "canine", "first premolar", "second premolar", "first molar", "second molar", "third molar"];
const PRIMARY_NAMES = ["central incisor", "lateral incisor", "canine", "first molar", "second molar"];
const LETTERS = "ABCDEFGHIJKLMNOPQRST";

/** Parses an ISO 3950 two-digit code (11–48 permanent, 51–85 primary). */
export function fromFdi(input: number | string): Tooth {
  const text = String(input).trim();
  if (!/^\d{2}$/.test(text)) throw new ToothError(`"${text}" is not an ISO 3950 tooth code: use two digits, like 36.`);
  const q = Number(text[0]);
  const p = Number(text[1]);
  const primary = q >= 5 && q <= 8;
  if (!((q >= 1 && q <= 4 && p >= 1 && p <= 8) || (primary && p >= 1 && p <= 5))) {
    throw new ToothError(`${text} is not a tooth: permanent teeth are 11–18, 21–28, 31–38, 41–48; primary teeth 51–55, 61–65, 71–75, 81–85.`);
  }
  const quadrant = (primary ? q - 4 : q) as 1 | 2 | 3 | 4;
  const side = SIDES[quadrant - 1];
  const name = (primary ? PRIMARY_NAMES : PERMANENT_NAMES)[p - 1];
  return {
    fdi: q * 10 + p,
    universal: primary ? LETTERS[primaryUniversalIndex(quadrant, p)] : String(permanentUniversal(quadrant, p)),
    primary,
    quadrant,
    position: p,
    toothClass: p <= 3 ? "anterior" : primary || p >= 6 ? "molar" : "premolar",
    words: `${side} ${primary ? "primary " : ""}${name}`,
  };
}

// Universal numbers run from the upper right third molar (1) across to the upper left (16),
// then from the lower left third molar (17) across to the lower right (32).
function permanentUniversal(quadrant: number, p: number): number {
  switch (quadrant) {
    case 1: return 9 - p;
    case 2: return 8 + p;
    case 3: return 25 - p;
    default: return 24 + p;
  }
}

function primaryUniversalIndex(quadrant: number, p: number): number {
  switch (quadrant) {
    case 1: return 5 - p;
    case 2: return 4 + p;
    case 3: return 15 - p;
    default: return 14 + p;
  }
}

/** Parses a Universal number ("1"–"32") or primary letter ("A"–"T"). */
export function fromUniversal(input: number | string): Tooth {
  const text = String(input).trim().toUpperCase();
  if (/^[A-T]$/.test(text)) {
    const i = LETTERS.indexOf(text);
    const [q, p] = i < 5 ? [5, 5 - i] : i < 10 ? [6, i - 4] : i < 15 ? [7, 15 - i] : [8, i - 14];
    return fromFdi(q * 10 + p);
  }
  if (!/^\d{1,2}$/.test(text) || Number(text) < 1 || Number(text) > 32) {
    throw new ToothError(`"${text}" is not a Universal tooth number: use 1–32, or A–T for primary teeth.`);
  }
  const n = Number(text);
  const [q, p] = n <= 8 ? [1, 9 - n] : n <= 16 ? [2, n - 8] : n <= 24 ? [3, 25 - n] : [4, n - 24];
  return fromFdi(q * 10 + p);
}

export type ToothSystem = "fdi" | "universal";

/** A bare number is ambiguous ("11" exists in both systems), so the caller must name the system. */
export function parseTooth(input: number | string, system: ToothSystem): Tooth {
  return system === "fdi" ? fromFdi(input) : fromUniversal(input);
}

export function isValidFdi(input: number | string): boolean {
  try {
    fromFdi(input);
    return true;
  } catch {
    return false;
  }
}

/** "36 (Universal 19) — lower left first molar" */
export function describeTooth(fdi: number): Tooth & { label: string } {
  const t = fromFdi(fdi);
  return { ...t, label: `${t.fdi} (Universal ${t.universal}) — ${t.words}` };
}
