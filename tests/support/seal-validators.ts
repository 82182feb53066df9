// Independent checks of a sealed PDF with standard tools, not the library family that signed it:
// poppler's pdfsig (as PDF readers on Linux validate) and OpenSSL's `cms -verify` over the bytes
// the /ByteRange covers, with the clinic certificate as the only trust anchor.
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export type ToolResult = { status: number | null; out: string };

function tool(cmd: string, args: string[], files: Record<string, Buffer | string>): ToolResult {
  const dir = mkdtempSync(path.join(tmpdir(), "cuspal-seal-"));
  try {
    for (const [name, bytes] of Object.entries(files)) writeFileSync(path.join(dir, name), bytes);
    const r = spawnSync(cmd, args.map((a) => a.replace(/^@/, `${dir}/`)), { encoding: "utf8", env: { ...process.env, LC_ALL: "C.UTF-8" } });
    if (r.error) throw new Error(`${cmd} could not run (${r.error.message}); npm test installs it (poppler-utils, openssl).`);
    return { status: r.status, out: `${r.stdout}${r.stderr}` };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The last signature's signed bytes and its CMS (the DER, without the placeholder's zero padding). */
export function signedParts(pdf: Buffer): { content: Buffer; cms: Buffer } {
  const ranges = [...pdf.toString("latin1").matchAll(/\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g)];
  if (!ranges.length) throw new Error("No /ByteRange in this PDF.");
  const [a, b, c, d] = ranges[ranges.length - 1].slice(1).map(Number);
  const padded = Buffer.from(pdf.subarray(a + b + 1, c - 1).toString("latin1"), "hex");
  // The DER's own length (X.690 §8.1.3): short form, or 0x8N followed by N length bytes.
  const first = padded[1];
  const lengthBytes = first & 0x80 ? first & 0x7f : 0;
  const length = lengthBytes ? padded.subarray(2, 2 + lengthBytes).reduce((n, byte) => n * 256 + byte, 0) : first;
  return { content: Buffer.concat([pdf.subarray(a, a + b), pdf.subarray(c, c + d)]), cms: padded.subarray(0, 2 + lengthBytes + length) };
}

/** poppler's report on every signature in the PDF. */
export function pdfsig(pdf: Buffer): ToolResult {
  return tool("pdfsig", ["@doc.pdf"], { "doc.pdf": pdf });
}

/** OpenSSL's verdict on the seal, trusting only `caPem`. */
export function opensslVerify(pdf: Buffer, caPem: string): ToolResult {
  const { content, cms } = signedParts(pdf);
  return tool(
    "openssl",
    ["cms", "-verify", "-binary", "-inform", "DER", "-in", "@sig.der", "-content", "@content.bin", "-CAfile", "@ca.pem", "-purpose", "any", "-out", "/dev/null"],
    { "sig.der": cms, "content.bin": content, "ca.pem": caPem },
  );
}

/** OpenSSL's printout of the CMS structure (attributes by name). */
export function opensslPrint(pdf: Buffer): ToolResult {
  return tool("openssl", ["cms", "-cmsout", "-print", "-inform", "DER", "-in", "@sig.der"], { "sig.der": signedParts(pdf).cms });
}

/** The certificate inside a PKCS#12 file, as PEM, read by OpenSSL. */
export function certificateFromP12(p12: Buffer, password: string): string {
  const r = tool("openssl", ["pkcs12", "-in", "@seal.p12", "-nokeys", "-clcerts", "-passin", `pass:${password}`], { "seal.p12": p12 });
  const pem = r.out.match(/-----BEGIN CERTIFICATE-----[\s\S]+?-----END CERTIFICATE-----/)?.[0];
  if (r.status !== 0 || !pem) throw new Error(`openssl could not read the certificate: ${r.out}`);
  return `${pem}\n`;
}
