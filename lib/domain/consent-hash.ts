// SHA-256 over consent text and PDF bytes, as lowercase hex (stored and compared as text).
import { createHash } from "node:crypto";

export function sha256Hex(data: string | Uint8Array): string {
  const hash = createHash("sha256");
  hash.update(typeof data === "string" ? Buffer.from(data.normalize("NFC"), "utf8") : data);
  return hash.digest("hex");
}

export function isSha256Hex(value: string): boolean {
  return /^[0-9a-f]{64}$/.test(value);
}
