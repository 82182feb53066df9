// The mill preparation list: for each mill, the blocks to load in the order the mill cuts them,
// each with its load window (after the previous crown leaves that mill, before this visit's
// fabrication starts, which is when the design is done). Pure; times in epoch ms.

export type PrepVisit = {
  id: string;
  initials: string;
  tooth: number;
  material: string;
  shade: string | null;
  blockSize: string | null;
  millId: string;
  /** Projected times of the visit's design end (= fabrication start) and fabrication end. */
  fabricationStart: number;
  fabricationEnd: number;
  fabricationDone: boolean;
  loadedAt: number | null;
  lots: string[];
};

export type PrepItem = PrepVisit & {
  /** The earliest the block can go in: when the previous crown on this mill is done. */
  loadFrom: number | null;
  /** Load by then, so the mill can start as soon as the design is done. */
  loadBy: number;
  state: "loaded" | "due" | "late" | "cut";
  missing: ("shade" | "block size")[];
};

export function millPrepList(visits: PrepVisit[], now: number): Map<string, PrepItem[]> {
  const byMill = new Map<string, PrepItem[]>();
  const sorted = [...visits].sort((a, b) => a.fabricationStart - b.fabricationStart);
  for (const v of sorted) {
    const list = byMill.get(v.millId) ?? [];
    const previous = list.at(-1);
    const missing: PrepItem["missing"] = [];
    if (!v.shade) missing.push("shade");
    if (!v.blockSize) missing.push("block size");
    const state: PrepItem["state"] = v.fabricationDone ? "cut" : v.loadedAt !== null ? "loaded" : now > v.fabricationStart ? "late" : "due";
    list.push({ ...v, loadFrom: previous ? previous.fabricationEnd : null, loadBy: v.fabricationStart, state, missing });
    byMill.set(v.millId, list);
  }
  return byMill;
}
