// Tooth shades on the VITA classical shade guide: the trade's open naming of its 16 tabs.
export const VITA_CLASSICAL_SHADES = ["A1", "A2", "A3", "A3.5", "A4", "B1", "B2", "B3", "B4", "C1", "C2", "C3", "C4", "D2", "D3", "D4"] as const;
export type VitaShade = (typeof VITA_CLASSICAL_SHADES)[number];

export function isVitaShade(value: string): value is VitaShade {
  return (VITA_CLASSICAL_SHADES as readonly string[]).includes(value);
}
