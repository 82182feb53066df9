// Time-based one-time codes (RFC 6238) through otplib, and the encryption of their secrets at
// rest: AES-256-GCM with a key derived (HKDF-SHA-256) from NEXTAUTH_SECRET, so a database dump
// alone does not reveal them. Pure functions apart from reading the secret from the environment.
import { createCipheriv, createDecipheriv, createHash, hkdfSync, randomBytes, randomInt } from "node:crypto";
import { generateSecret, generateURI, verify } from "otplib";

export const TOTP_DIGITS = 6;
export const TOTP_PERIOD = 30;
/** One step either side, for phones whose clock is a little off. */
const TOLERANCE_SECONDS = TOTP_PERIOD;

export const newTotpSecret = () => generateSecret({ length: 20 });

export function totpUri(secret: string, account: string): string {
  return generateURI({ issuer: "Cuspal", label: account, secret, digits: TOTP_DIGITS, period: TOTP_PERIOD });
}

/** The time step the code matched, or null; steps at or before `afterStep` are refused (no replay). */
export async function checkTotp(secret: string, code: string, opts: { now?: Date; afterStep?: number | null } = {}): Promise<number | null> {
  if (!/^\d{6}$/.test(code)) return null;
  const result = await verify({
    secret,
    token: code,
    digits: TOTP_DIGITS,
    period: TOTP_PERIOD,
    epoch: Math.floor((opts.now ?? new Date()).getTime() / 1000),
    epochTolerance: TOLERANCE_SECONDS,
    ...(opts.afterStep != null ? { afterTimeStep: opts.afterStep } : {}),
  });
  return result.valid ? (result as { timeStep: number }).timeStep : null;
}

function key(): Buffer {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret || secret.length < 16) throw new Error("NEXTAUTH_SECRET must be set to protect two-factor secrets.");
  return Buffer.from(hkdfSync("sha256", secret, "cuspal", "two-factor secret", 32));
}

/** "v1.<iv>.<tag>.<ciphertext>" in base64url. */
export function sealSecret(plain: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", key(), iv);
  const body = Buffer.concat([cipher.update(plain, "utf8"), cipher.final()]);
  return ["v1", iv, cipher.getAuthTag(), body].map((p) => (typeof p === "string" ? p : p.toString("base64url"))).join(".");
}

export function openSecret(sealed: string): string {
  const [version, iv, tag, body] = sealed.split(".");
  if (version !== "v1" || !iv || !tag || !body) throw new Error("Unknown two-factor secret format.");
  const decipher = createDecipheriv("aes-256-gcm", key(), Buffer.from(iv, "base64url"));
  decipher.setAuthTag(Buffer.from(tag, "base64url"));
  return Buffer.concat([decipher.update(Buffer.from(body, "base64url")), decipher.final()]).toString("utf8");
}

// Recovery codes: ten of them, 10 characters from an alphabet without look-alikes, shown as
// xxxxx-xxxxx. They carry 50 bits each, so a plain SHA-256 is enough to store them.
const ALPHABET = "abcdefghjkmnpqrstuvwxyz23456789";
export const RECOVERY_CODE_COUNT = 10;

export function newRecoveryCodes(): string[] {
  return Array.from({ length: RECOVERY_CODE_COUNT }, () => {
    const chars = Array.from({ length: 10 }, () => ALPHABET[randomInt(ALPHABET.length)]).join("");
    return `${chars.slice(0, 5)}-${chars.slice(5)}`;
  });
}

export function normaliseRecoveryCode(code: string): string {
  return code.toLowerCase().replace(/[^a-z0-9]/g, "");
}

export function hashRecoveryCode(code: string): string {
  return createHash("sha256").update(normaliseRecoveryCode(code)).digest("hex");
}

export const looksLikeRecoveryCode = (code: string) => normaliseRecoveryCode(code).length === 10 && !/^\d+$/.test(code.trim());
