// Decides whether a drawn signature is real enough to accept: an empty canvas, a dot or a
// short dash is refused. Works on decoded RGBA pixels, so the server can check what it stores.

/** Largest signature upload we accept, in bytes of PNG (a drawn signature is usually 5–40 kB). */
export const MAX_SIGNATURE_BYTES = 200_000;
/** Largest canvas we accept, in pixels per side (a phone at 3× pixel density stays well below). */
export const MAX_SIGNATURE_SIDE = 3000;

export type InkStats = { inked: number; width: number; height: number; box: { left: number; top: number; right: number; bottom: number } | null };

/** Counts pixels with visible ink (alpha over a quarter and darker than light grey) and their bounding box. */
export function inkStats(rgba: Uint8Array, width: number, height: number): InkStats {
  if (rgba.length < width * height * 4) throw new Error("Pixel data is shorter than width × height × 4.");
  let inked = 0;
  let left = width, top = height, right = -1, bottom = -1;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      const alpha = rgba[i + 3];
      const lightness = (rgba[i] + rgba[i + 1] + rgba[i + 2]) / 3;
      if (alpha < 64 || lightness > 200) continue;
      inked++;
      if (x < left) left = x;
      if (x > right) right = x;
      if (y < top) top = y;
      if (y > bottom) bottom = y;
    }
  }
  return { inked, width, height, box: inked ? { left, top, right, bottom } : null };
}

/** null when acceptable, else the sentence to show. */
export function signatureProblem(stats: InkStats): string | null {
  if (!stats.box || stats.inked === 0) return "Please draw your signature in the box.";
  const boxWidth = stats.box.right - stats.box.left + 1;
  const boxHeight = stats.box.bottom - stats.box.top + 1;
  // Relative to the canvas, so it works at any pixel density: a signature spans a fair part
  // of the box's width, has some height, and has enough ink to be more than a dot or a dash.
  const minInk = Math.max(60, Math.round(stats.width * stats.height * 0.001));
  if (boxWidth < stats.width * 0.15 || boxHeight < stats.height * 0.08 || stats.inked < minInk) {
    return "That signature is too small or too simple. Please sign with your usual signature, using more of the box.";
  }
  return null;
}
