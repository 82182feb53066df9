// Sample uploads made in the test itself (no binary fixtures): a JPEG whose EXIF block carries a
// GPS position and an orientation, written byte by byte so the sample does not depend on the
// library that later strips it; plus small PNG and PDF files, and a PNG of few bytes and huge size.
import { crc32, deflateSync } from "node:zlib";
import sharp from "sharp";

/** Where the sample photo claims it was taken (an invented spot): 43°39'12.5" N, 79°23'1" W. */
export const SAMPLE_GPS = { latitude: 43 + 39 / 60 + 12.5 / 3600, longitude: -(79 + 23 / 60 + 1 / 3600) };

type Entry = { tag: number; type: number; count: number; value: Buffer };
const TYPE_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8 };

/** One little-endian TIFF IFD at `start`, with out-of-line values placed right after it. */
function ifd(entries: Entry[], start: number): Buffer {
  const head = Buffer.alloc(2 + entries.length * 12 + 4);
  head.writeUInt16LE(entries.length, 0);
  let dataOffset = start + head.length;
  const data: Buffer[] = [];
  entries.forEach((e, i) => {
    const at = 2 + i * 12;
    head.writeUInt16LE(e.tag, at);
    head.writeUInt16LE(e.type, at + 2);
    head.writeUInt32LE(e.count, at + 4);
    if (TYPE_SIZE[e.type] * e.count <= 4) {
      e.value.copy(head, at + 8);
    } else {
      head.writeUInt32LE(dataOffset, at + 8);
      data.push(e.value);
      dataOffset += e.value.length;
    }
  });
  return Buffer.concat([head, ...data]);
}

const short = (n: number) => { const b = Buffer.alloc(2); b.writeUInt16LE(n); return b; };
const long = (n: number) => { const b = Buffer.alloc(4); b.writeUInt32LE(n); return b; };
const rationals = (pairs: [number, number][]) => Buffer.concat(pairs.flatMap(([a, b]) => [long(a), long(b)]));

/** The APP1 "Exif" segment: IFD0 (orientation, pointer to the GPS IFD) and the GPS IFD. */
export function exifSegment(orientation = 6): Buffer {
  const ifd0Size = 2 + 2 * 12 + 4;
  const gpsStart = 8 + ifd0Size;
  const ifd0 = ifd([
    { tag: 0x0112, type: 3, count: 1, value: short(orientation) },
    { tag: 0x8825, type: 4, count: 1, value: long(gpsStart) },
  ], 8);
  const gps = ifd([
    { tag: 0x0000, type: 1, count: 4, value: Buffer.from([2, 3, 0, 0]) },
    { tag: 0x0001, type: 2, count: 2, value: Buffer.from("N\0", "latin1") },
    { tag: 0x0002, type: 5, count: 3, value: rationals([[43, 1], [39, 1], [125, 10]]) },
    { tag: 0x0003, type: 2, count: 2, value: Buffer.from("W\0", "latin1") },
    { tag: 0x0004, type: 5, count: 3, value: rationals([[79, 1], [23, 1], [1, 1]]) },
  ], gpsStart);
  const tiff = Buffer.concat([Buffer.from("II*\0", "latin1"), long(8), ifd0, gps]);
  const payload = Buffer.concat([Buffer.from("Exif\0\0", "latin1"), tiff]);
  const marker = Buffer.from([0xff, 0xe1, 0, 0]);
  marker.writeUInt16BE(payload.length + 2, 2);
  return Buffer.concat([marker, payload]);
}

/** A width × height JPEG (stored sideways: EXIF orientation 6) with the GPS block above. */
export async function jpegWithGps({ width = 64, height = 32 } = {}): Promise<Buffer> {
  const plain = await sharp({ create: { width, height, channels: 3, background: "#b98a6a" } }).jpeg({ quality: 90 }).toBuffer();
  // Right after the start-of-image marker, as cameras write it.
  return Buffer.concat([plain.subarray(0, 2), exifSegment(), plain.subarray(2)]);
}

export async function pngImage({ width = 24, height = 24 } = {}): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: "#4d8a8a" } }).png().toBuffer();
}

/** A minimal one-page PDF (enough for a content check: it starts with the %PDF- signature). */
export function pdfDocument(text = "Referral letter"): Buffer {
  return Buffer.from(
    `%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [3 0 R] /Count 1 >> endobj\n` +
      `3 0 obj << /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >> endobj\n% ${text}\ntrailer << /Root 1 0 R >>\n%%EOF\n`,
    "latin1",
  );
}

/**
 * A valid PNG of `width` × `height` black pixels written chunk by chunk (ISO/IEC 15948: signature,
 * IHDR, IDAT, IEND, each with its CRC-32): one bit per pixel and all-zero rows deflate to a few
 * kilobytes however large the declared size, like an image crafted to exhaust a decoder.
 */
export function hugePng(width = 16_000, height = 16_000): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
    const out = Buffer.alloc(12 + data.length);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // greyscale; compression, filter and interlace bytes stay 0
  const rows = Buffer.alloc(height * (1 + Math.ceil(width / 8))); // each row: filter type 0, then zeros
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", deflateSync(rows, { level: 9 })),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}
