// Reads the session cookie's token exactly as next-auth 4's own `decode` does (a JWE with
// alg "dir" / enc "A256GCM", its key derived from NEXTAUTH_SECRET with HKDF-SHA256, 15 s clock
// tolerance), except that the key is derived once per secret rather than on every request: the
// derivation was most of the cost of reading a session. next-auth still writes and renews cookies.
import "server-only";
import { hkdfSync } from "node:crypto";
import { jwtDecrypt } from "jose";
import type { JWT, JWTDecodeParams } from "next-auth/jwt";

const keys = new Map<string, Uint8Array>();

/** next-auth's key for a secret (and optional salt): 32 bytes of HKDF-SHA256 with its info string. */
export function sessionKey(secret: string, salt = ""): Uint8Array {
  const id = `${salt}\u0000${secret}`;
  let key = keys.get(id);
  if (!key) {
    const info = `NextAuth.js Generated Encryption Key${salt ? ` (${salt})` : ""}`;
    key = new Uint8Array(hkdfSync("sha256", secret, salt, info, 32));
    keys.set(id, key);
  }
  return key;
}

/** A drop-in for next-auth's `decode`: the token's payload, or a thrown error if it is not ours or has expired. */
export async function decodeSessionToken({ token, secret, salt }: JWTDecodeParams): Promise<JWT | null> {
  if (!token) return null;
  const { payload } = await jwtDecrypt(token, sessionKey(String(secret), salt), { clockTolerance: 15 });
  return payload as JWT;
}
