// Page layout for the consent PDF, kept apart from its wording: a writer that flows text down A4
// pages, wraps lines and draws rows, flags, rules and the signature image. Text layout is linear
// in the length of the text: widths are cached per font and size (a word is measured once, and a
// word longer than a line is split in one pass over its characters), so no input can make
// signing slow.
import { PDFHexString, rgb, type PDFDocument, type PDFFont, type PDFImage, type PDFPage, type RGB } from "pdf-lib";

export const PAGE = { width: 595.28, height: 841.89, margin: 56, bottom: 64 };
export const INK = rgb(0.12, 0.16, 0.22);
export const MUTED = rgb(0.33, 0.38, 0.43);
export const HARBOUR = rgb(0.05, 0.43, 0.43);
const CLAY = rgb(0.54, 0.23, 0.13);
const CLAY_BG = rgb(0.98, 0.94, 0.91);
const OCHRE = rgb(0.43, 0.33, 0.05);
const OCHRE_BG = rgb(0.98, 0.96, 0.87);
const LINE = rgb(0.85, 0.83, 0.78);

export type Fonts = { regular: PDFFont; bold: PDFFont };

/** A flag box: its level in words (so it does not rely on colour) and its text. */
export type FlagBox = { level: "alert" | "check"; tag: string; body: string };

// Only characters the font can draw: control characters would break the content stream.
export function clean(text: string): string {
  return text.normalize("NFC").replace(/\t/g, " ").replace(/[\u0000-\u001f\u007f]/g, "");
}

// Scripts that pdf-lib draws one glyph per code point, with no joining or reordering: Latin,
// Greek, Cyrillic, general punctuation and symbols (combining marks excluded). Text in other
// scripts goes through fontkit's full shaping, measured and encoded whole.
const ONE_GLYPH_PER_CHAR = /^[\u0020-\u02ff\u0370-\u0482\u048a-\u052f\u1e00-\u1fff\u2000-\u2bff]*$/;

/** Widths for one font at one size: a plain word is the sum of its cached character advances. */
export class Measure {
  private readonly words = new Map<string, number>();
  private readonly chars = new Map<string, number>();
  readonly space: number;

  constructor(readonly font: PDFFont, readonly size: number) {
    this.space = this.char(" ");
  }

  /** pdf-lib's width is the sum of the glyphs' advance widths (no kerning), so summing per character is exact. */
  word(word: string): number {
    if (ONE_GLYPH_PER_CHAR.test(word)) {
      let w = 0;
      for (const char of word) w += this.char(char);
      return w;
    }
    let w = this.words.get(word);
    if (w === undefined) {
      w = this.font.widthOfTextAtSize(word, this.size);
      this.words.set(word, w);
    }
    return w;
  }

  char(char: string): number {
    let w = this.chars.get(char);
    if (w === undefined) {
      w = this.font.widthOfTextAtSize(char, this.size);
      this.chars.set(char, w);
    }
    return w;
  }

  /** Splits a word wider than `width` into pieces that fit, in one pass over its characters. */
  split(word: string, width: number): string[] {
    const pieces: string[] = [];
    let piece = "";
    let used = 0;
    for (const char of word) {
      const w = this.char(char);
      if (piece && used + w > width) {
        pieces.push(piece);
        piece = "";
        used = 0;
      }
      piece += char;
      used += w;
    }
    if (piece) pieces.push(piece);
    return pieces;
  }
}

/**
 * Makes drawing plain text cost a lookup per character: fontkit shapes every drawn line from
 * scratch, which dominates the time to lay out a long consent. A character's glyph is encoded
 * once through pdf-lib (so the font subset still records it) and reused; other text is shaped.
 */
export function cacheGlyphEncoding(font: PDFFont): void {
  const shaped = font.encodeText.bind(font);
  const glyphs = new Map<string, string>();
  font.encodeText = (text: string) => {
    if (!ONE_GLYPH_PER_CHAR.test(text)) return shaped(text);
    let hex = "";
    for (const char of text) {
      let glyph = glyphs.get(char);
      if (glyph === undefined) {
        glyph = shaped(char).toString().slice(1, -1); // "<0041>" → "0041"
        glyphs.set(char, glyph);
      }
      hex += glyph;
    }
    return PDFHexString.of(hex);
  };
}

/**
 * Greedy line breaking at spaces, linear in the text's length. Line widths are summed from word
 * widths (kerning across a space is ignored, a fraction of a point), so no line is measured twice.
 */
export function wrapText(text: string, measure: Measure, width: number): string[] {
  const lines: string[] = [];
  // Split before cleaning: a line break is a control character, and a patient's lines stay lines.
  for (const paragraph of text.split(/\r\n?|\n/).map(clean)) {
    let line = "";
    let used = 0;
    for (const word of paragraph.split(/ +/)) {
      const w = measure.word(word);
      const extra = line ? measure.space + w : w;
      if (used + extra <= width) {
        line = line ? `${line} ${word}` : word;
        used += extra;
        continue;
      }
      if (line) lines.push(line);
      if (w <= width) {
        line = word;
        used = w;
        continue;
      }
      // A word longer than the line (a hash, a user agent) is broken by characters.
      const pieces = measure.split(word, width);
      const last = pieces.pop() ?? "";
      lines.push(...pieces);
      line = last;
      used = measure.word(last);
    }
    lines.push(line);
  }
  return lines;
}

export class Writer {
  page!: PDFPage;
  y = 0;
  readonly width = PAGE.width - PAGE.margin * 2;
  private readonly measures = new Map<string, Measure>();

  constructor(readonly doc: PDFDocument, readonly fonts: Fonts) {
    cacheGlyphEncoding(fonts.regular);
    cacheGlyphEncoding(fonts.bold);
    this.newPage();
  }

  measure(font: PDFFont, size: number): Measure {
    const key = `${font === this.fonts.bold ? "b" : "r"}${size}`;
    let m = this.measures.get(key);
    if (!m) {
      m = new Measure(font, size);
      this.measures.set(key, m);
    }
    return m;
  }

  wrap(text: string, font: PDFFont, size: number, width: number): string[] {
    return wrapText(text, this.measure(font, size), width);
  }

  newPage() {
    this.page = this.doc.addPage([PAGE.width, PAGE.height]);
    this.y = PAGE.height - PAGE.margin;
  }

  ensure(height: number) {
    if (this.y - height < PAGE.bottom) this.newPage();
  }

  gap(points: number) {
    this.y -= points;
  }

  text(text: string, opts: { size?: number; bold?: boolean; color?: RGB; indent?: number; width?: number; after?: number } = {}) {
    const size = opts.size ?? 10.5;
    const font = opts.bold ? this.fonts.bold : this.fonts.regular;
    const indent = opts.indent ?? 0;
    const leading = size * 1.4;
    for (const line of this.wrap(text, font, size, (opts.width ?? this.width) - indent)) {
      this.ensure(leading);
      this.y -= leading;
      if (line) this.page.drawText(line, { x: PAGE.margin + indent, y: this.y + size * 0.3, size, font, color: opts.color ?? INK });
    }
    this.gap(opts.after ?? 4);
  }

  heading(text: string, size = 13) {
    this.ensure(size * 4);
    this.gap(8);
    this.text(text, { size, bold: true, color: HARBOUR, after: 2 });
  }

  bullet(text: string) {
    const size = 10.5;
    this.ensure(size * 1.4);
    this.page.drawText("•", { x: PAGE.margin + 4, y: this.y - size * 1.4 + size * 0.3, size, font: this.fonts.regular, color: INK });
    this.text(text, { indent: 16, after: 2 });
  }

  rule() {
    this.ensure(12);
    this.gap(6);
    this.page.drawLine({ start: { x: PAGE.margin, y: this.y }, end: { x: PAGE.width - PAGE.margin, y: this.y }, thickness: 0.75, color: LINE });
    this.gap(6);
  }

  row(label: string, value: string) {
    const labelWidth = 150;
    const size = 10.5;
    const leading = size * 1.4;
    const labelLines = this.wrap(label, this.fonts.bold, size, labelWidth - 8);
    const valueLines = this.wrap(value, this.fonts.regular, size, this.width - labelWidth);
    const n = Math.max(labelLines.length, valueLines.length);
    this.ensure(leading * Math.min(n, 4));
    for (let i = 0; i < n; i++) {
      this.ensure(leading);
      this.y -= leading;
      const baseline = this.y + size * 0.3;
      if (labelLines[i]) this.page.drawText(labelLines[i], { x: PAGE.margin, y: baseline, size, font: this.fonts.bold, color: MUTED });
      if (valueLines[i]) this.page.drawText(valueLines[i], { x: PAGE.margin + labelWidth, y: baseline, size, font: this.fonts.regular, color: INK });
    }
    this.gap(3);
  }

  /** A label with a long unbroken value (a fingerprint) on its own full-width line. */
  fingerprint(label: string, value: string) {
    this.text(label, { size: 9.5, bold: true, color: MUTED, after: 0 });
    this.text(value, { size: 9, after: 4 });
  }

  /** A flag in a tinted box with its level spelled out; a long one continues on the next page. */
  flag(flag: FlagBox) {
    const size = 10.5;
    const leading = size * 1.4;
    const lines = this.wrap(flag.body, this.fonts.regular, size, this.width - 70);
    const alert = flag.level === "alert";
    // At most a page's worth of lines per box, so a long note never runs off the page.
    const perPage = Math.floor((PAGE.height - PAGE.margin - PAGE.bottom - 14) / leading);
    for (let start = 0; start < lines.length; start += perPage) {
      const chunk = lines.slice(start, start + perPage);
      const height = chunk.length * leading + 10;
      this.ensure(height + 4);
      const top = this.y;
      this.page.drawRectangle({
        x: PAGE.margin, y: top - height, width: this.width, height,
        color: alert ? CLAY_BG : OCHRE_BG, borderColor: alert ? CLAY : OCHRE, borderWidth: 0.75,
      });
      this.page.drawText(flag.tag, { x: PAGE.margin + 8, y: top - 5 - leading + size * 0.3, size: 9, font: this.fonts.bold, color: alert ? CLAY : OCHRE });
      chunk.forEach((line, i) => {
        if (line) this.page.drawText(line, { x: PAGE.margin + 62, y: top - 5 - (i + 1) * leading + size * 0.3, size, font: this.fonts.regular, color: INK });
      });
      this.y = top - height - 4;
    }
  }

  image(image: PDFImage, maxWidth: number, maxHeight: number) {
    const scale = Math.min(maxWidth / image.width, maxHeight / image.height, 1);
    const w = image.width * scale;
    const h = image.height * scale;
    this.ensure(h + 8);
    this.page.drawRectangle({ x: PAGE.margin, y: this.y - h - 8, width: maxWidth + 8, height: h + 8, borderColor: LINE, borderWidth: 0.75 });
    this.page.drawImage(image, { x: PAGE.margin + 4, y: this.y - h - 4, width: w, height: h });
    this.y -= h + 14;
  }
}
