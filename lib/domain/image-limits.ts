// The largest image we decode, counted in pixels rather than bytes: a few kilobytes of PNG can
// declare 16,000 × 16,000 pixels and take a gigabyte to decode. Checked from the image's header
// before any decoding, and passed to the decoder as its own limit as well.

/** 40 megapixels: a 48 MP phone photo saved at full size is refused; phones save 12 MP by default. */
export const MAX_IMAGE_PIXELS = 40_000_000;

export function tooManyPixels(width: number, height: number): boolean {
  return width * height > MAX_IMAGE_PIXELS;
}

const megapixels = (n: number) => `${Math.round((n / 1_000_000) * 10) / 10} megapixels`;

export function tooManyPixelsMessage(width: number, height: number): string {
  return `This image is ${width.toLocaleString("en")} × ${height.toLocaleString("en")} pixels (${megapixels(width * height)}); the limit is ${megapixels(MAX_IMAGE_PIXELS)}. Please choose a smaller image, or take the photo again at a lower resolution.`;
}
