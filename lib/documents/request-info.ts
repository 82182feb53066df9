// The caller's IP and browser for audit events recorded while a page renders.
import "server-only";
import { headers } from "next/headers";
import { clientInfo } from "@/lib/server/api";

export async function pageClientInfo(): Promise<{ ip: string; userAgent: string }> {
  return clientInfo({ headers: await headers() } as Request);
}
