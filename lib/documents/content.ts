// Checks an upload by its bytes and prepares it for storage: the type comes from the content
// (magic bytes), never from the name or the browser's claim, and photos lose their metadata
// (EXIF, including GPS location, XMP and IPTC) before they are stored.
import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp from "sharp";
import { AppError } from "@/lib/server/errors";
import {
  ALLOWED_CONTENT, isAllowedContentType, MAX_DOCUMENT_BYTES, tooLargeMessage, unsupportedContentMessage, type AllowedContentType,
} from "@/lib/domain/documents";
import { MAX_IMAGE_PIXELS, tooManyPixels, tooManyPixelsMessage } from "@/lib/domain/image-limits";

export type PreparedContent = { bytes: Uint8Array; contentType: AllowedContentType };

export async function detectContentType(bytes: Uint8Array): Promise<string | undefined> {
  return (await fileTypeFromBuffer(bytes))?.mime;
}

/** Throws 413, 415 or 422 as an AppError; returns the bytes to store and their real type. */
export async function prepareContent(bytes: Uint8Array): Promise<PreparedContent> {
  if (bytes.byteLength > MAX_DOCUMENT_BYTES) throw new AppError(413, tooLargeMessage(bytes.byteLength), { field: "file", code: "too_large" });
  const detected = await detectContentType(bytes);
  if (!isAllowedContentType(detected)) {
    throw new AppError(415, unsupportedContentMessage(detected), { field: "file", code: "unsupported_type" });
  }
  if (!ALLOWED_CONTENT[detected].image) return { bytes, contentType: detected };
  return { bytes: await stripImageMetadata(bytes, detected), contentType: detected };
}

/**
 * Re-encodes the image without any metadata. The pixels are first turned upright from the EXIF
 * orientation, which is lost with the rest; the colour profile is kept because it is not personal.
 */
export async function stripImageMetadata(bytes: Uint8Array, type: AllowedContentType): Promise<Uint8Array> {
  // The header alone gives the size: refuse a huge image before a single pixel is decoded.
  const { width, height } = await sharp(bytes).metadata().catch(() => ({ width: undefined, height: undefined }));
  if (width && height && tooManyPixels(width, height)) {
    throw new AppError(422, tooManyPixelsMessage(width, height), { field: "file", code: "too_many_pixels" });
  }
  try {
    const pipeline = sharp(bytes, { failOn: "error", limitInputPixels: MAX_IMAGE_PIXELS }).rotate().keepIccProfile();
    const out =
      type === "image/jpeg" ? pipeline.jpeg({ quality: 90, mozjpeg: true })
      : type === "image/png" ? pipeline.png()
      : pipeline.webp({ quality: 90 });
    return new Uint8Array(await out.toBuffer());
  } catch {
    // The signature matched but the image itself cannot be read: treat it as not an image.
    throw new AppError(415, "This image is damaged or incomplete, so we cannot store it. Please take the photo again or choose another file.", {
      field: "file",
      code: "unsupported_type",
    });
  }
}
