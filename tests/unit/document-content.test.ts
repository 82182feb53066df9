// Content checks by bytes (file-type) and metadata removal (sharp), verified with a separate,
// general-purpose EXIF reader (exifr) reading the bytes that would be stored.
import exifr from "exifr";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { MAX_DOCUMENT_BYTES } from "@/lib/domain/documents";
import { prepareContent } from "@/lib/documents/content";
import { AppError } from "@/lib/server/errors";
import { jpegWithGps, pdfDocument, pngImage, SAMPLE_GPS } from "../support/sample-files";

async function refusal(bytes: Uint8Array): Promise<AppError> {
  const err = await prepareContent(bytes).then(() => null, (e: unknown) => e);
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

describe("prepareContent", () => {
  it("removes the GPS position from a JPEG and keeps the picture upright", async () => {
    const original = await jpegWithGps({ width: 64, height: 32 });
    // The sample carries a readable position before the check: the test can fail.
    // Tag numbers (GPS IFD pointer 0x8825, GPSLatitude 0x0002 …) are Exif 2.3's [M] from memory; exifr decodes them.
    const before = await exifr.gps(original);
    expect(before?.latitude).toBeCloseTo(SAMPLE_GPS.latitude, 6);
    expect(before?.longitude).toBeCloseTo(SAMPLE_GPS.longitude, 6);

    const prepared = await prepareContent(original);
    expect(prepared.contentType).toBe("image/jpeg");
    expect(await exifr.gps(prepared.bytes)).toBeUndefined();
    const all = await exifr.parse(prepared.bytes, { tiff: true, exif: true, gps: true, xmp: true, iptc: true });
    expect(Object.keys(all ?? {}).filter((k) => /gps|latitude|longitude/i.test(k))).toEqual([]);
    // Orientation 6 means "rotate 90° clockwise to view" [M]: the stored pixels are turned upright.
    const meta = await sharp(prepared.bytes).metadata();
    expect([meta.width, meta.height]).toEqual([32, 64]);
    expect(meta.orientation).toBeUndefined();
  });

  it("removes the GPS position from a PNG's EXIF chunk", async () => {
    const original = await sharp(await pngImage())
      .withExif({ IFD3: { GPSLatitudeRef: "N", GPSLatitude: "43/1 39/1 125/10", GPSLongitudeRef: "W", GPSLongitude: "79/1 23/1 1/1" } })
      .png()
      .toBuffer();
    expect((await exifr.gps(original))?.latitude).toBeCloseTo(SAMPLE_GPS.latitude, 6);
    const prepared = await prepareContent(original);
    expect(prepared.contentType).toBe("image/png");
    expect(await exifr.gps(prepared.bytes)).toBeUndefined();
  });

  it("stores a PDF unchanged", async () => {
    const pdf = pdfDocument();
    const prepared = await prepareContent(pdf);
    expect(prepared.contentType).toBe("application/pdf");
    expect(Buffer.from(prepared.bytes).equals(pdf)).toBe(true);
  });

  it("refuses content that is not an allowed type, whatever it is called", async () => {
    const html = await refusal(Buffer.from("<!doctype html><script>alert(1)</script>"));
    expect(html.status).toBe(415);
    expect(html.field).toBe("file");
    expect(html.message).toMatch(/not a photo \(JPEG, PNG or WebP\) or a PDF/);
    expect((await refusal(Buffer.from("MZ\x90\x00\x03\x00\x00\x00\x04\x00\x00\x00\xff\xff", "latin1"))).status).toBe(415);
    // GIF89a signature [C]: a real image type that we do not accept.
    expect((await refusal(Buffer.from("GIF89a\x01\x00\x01\x00\x00\x00\x00;", "latin1"))).status).toBe(415);
  });

  it("names HEIC in its refusal", async () => {
    // An ISO base media 'ftyp' box with the 'heic' brand [M] from memory of ISO/IEC 23008-12.
    const heic = Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from("ftypheic\0\0\0\0mif1heic", "latin1"), Buffer.alloc(64)]);
    const err = await refusal(heic);
    expect(err.status).toBe(415);
    expect(err.message).toMatch(/HEIC/);
  });

  it("refuses a JPEG that starts right but is cut short", async () => {
    const whole = await jpegWithGps();
    const err = await refusal(whole.subarray(0, Math.floor(whole.length / 2)));
    expect(err.status).toBe(415);
    expect(err.message).toMatch(/damaged or incomplete/);
  });

  it("refuses more than 15 MB with 413", async () => {
    const err = await refusal(new Uint8Array(MAX_DOCUMENT_BYTES + 1));
    expect(err.status).toBe(413);
    expect(err.message).toMatch(/the limit is 15 MB/);
  });
});
