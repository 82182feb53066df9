// Furnace programmes: the clinic's own firing programmes (a name, minutes, the furnaces able to run
// them), assigned per material, mode and firing. A firing with a programme lasts the programme's
// minutes and may only use a furnace that can run it; a mode whose programme no working furnace
// can run is not offered. Pure.
import type { TimelineMode } from "./timeline";

export type FurnaceProgrammeRow = { id: string; name: string; minutes: number; furnaceIds: readonly string[] };

export type ProgrammeChoice = { heat: FurnaceProgrammeRow | null; glaze: FurnaceProgrammeRow | null };

export class ProgrammeUnavailable extends Error {}

/** The mode with its firing minutes taken from the assigned programmes. */
export function withProgrammeMinutes<M extends TimelineMode>(mode: M, choice: ProgrammeChoice): M {
  return {
    ...mode,
    ...(choice.heat ? { heatTreatmentMinutes: choice.heat.minutes } : {}),
    ...(choice.glaze ? { glazeFiringMinutes: choice.glaze.minutes } : {}),
  };
}

/**
 * The furnaces that can run every programme the visit fires (one furnace holds all of a visit's
 * firings), from the clinic's working furnaces; all of them when no programme is assigned.
 * Throws ProgrammeUnavailable, naming the programme, when none can.
 */
export function capableFurnaces(working: readonly string[], used: readonly (FurnaceProgrammeRow | null)[]): string[] {
  let out = [...working];
  for (const p of used) {
    if (!p) continue;
    const next = out.filter((id) => p.furnaceIds.includes(id));
    if (next.length === 0) {
      throw new ProgrammeUnavailable(
        working.some((id) => p.furnaceIds.includes(id))
          ? `No single working furnace can run all of this visit's firing programmes (“${p.name}” among them), so this finish is not offered.`
          : `No working furnace at this clinic can run the “${p.name}” programme, so this finish is not offered.`,
      );
    }
    out = next;
  }
  return out;
}
