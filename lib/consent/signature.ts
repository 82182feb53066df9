// Decodes the drawn signature the browser sends (a PNG data URL) and refuses an empty, trivial,
// oversized or malformed one before anything is stored.
import sharp from "sharp";
import { AppError } from "@/lib/server/errors";
import { inkStats, MAX_SIGNATURE_BYTES, MAX_SIGNATURE_SIDE, signatureProblem } from "@/lib/domain/consent-signature";
import { MAX_IMAGE_PIXELS } from "@/lib/domain/image-limits";

const PREFIX = "data:image/png;base64,";
const PNG_MAGIC = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

export async function decodeSignature(dataUrl: string): Promise<Buffer> {
  if (!dataUrl.startsWith(PREFIX)) throw new AppError(422, "Please draw your signature in the box.", { field: "signature" });
  const base64 = dataUrl.slice(PREFIX.length);
  if (base64.length > Math.ceil((MAX_SIGNATURE_BYTES * 4) / 3) + 4) {
    throw new AppError(413, "That signature image is too large. Clear the box and sign again.", { field: "signature" });
  }
  if (!/^[A-Za-z0-9+/]+={0,2}$/.test(base64)) throw new AppError(422, "The signature image could not be read. Clear the box and sign again.", { field: "signature" });
  const png = Buffer.from(base64, "base64");
  if (png.length < PNG_MAGIC.length || !png.subarray(0, 8).equals(PNG_MAGIC)) {
    throw new AppError(422, "The signature image could not be read. Clear the box and sign again.", { field: "signature" });
  }
  // The PNG header (IHDR, ISO/IEC 15948 §11.2.2) gives the canvas size before anything is decoded.
  const width = png.length >= 24 ? png.readUInt32BE(16) : 0;
  const height = png.length >= 24 ? png.readUInt32BE(20) : 0;
  if (width > MAX_SIGNATURE_SIDE || height > MAX_SIGNATURE_SIDE) {
    throw new AppError(
      422,
      `That signature image is ${width} × ${height} pixels; a signature box is at most ${MAX_SIGNATURE_SIDE} × ${MAX_SIGNATURE_SIDE}. Clear the box and sign again.`,
      { field: "signature" },
    );
  }
  let raw: { data: Buffer; info: { width: number; height: number } };
  try {
    const image = sharp(png, { limitInputPixels: Math.min(MAX_IMAGE_PIXELS, MAX_SIGNATURE_SIDE * MAX_SIGNATURE_SIDE) });
    const meta = await image.metadata();
    if (meta.format !== "png" || !meta.width || !meta.height || meta.width > MAX_SIGNATURE_SIDE || meta.height > MAX_SIGNATURE_SIDE) {
      throw new Error("unexpected size or format");
    }
    raw = await image.ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  } catch {
    throw new AppError(422, "The signature image could not be read. Clear the box and sign again.", { field: "signature" });
  }
  const problem = signatureProblem(inkStats(raw.data, raw.info.width, raw.info.height));
  if (problem) throw new AppError(422, problem, { field: "signature" });
  return png;
}
