import "server-only";
import { cookies } from "next/headers";
import { csrfCookieName } from "./csrf-cookie";

/** The token for the hidden `csrfToken` field of forms posted to /api/auth/* (the proxy makes sure the cookie exists). */
export async function csrfToken(): Promise<string> {
  const value = (await cookies()).get(csrfCookieName())?.value ?? "";
  return value.split("|")[0] ?? "";
}
