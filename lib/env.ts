// Environment variables, validated once with zod so a missing setting fails with a clear message.
import { z } from "zod";

const schema = z.object({
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a PostgreSQL URL" }),
  NEXTAUTH_SECRET: z.string().min(16, { message: "NEXTAUTH_SECRET must be at least 16 characters" }),
  APP_URL: z.string().url().default("http://localhost:3000"),
  SMTP_URL: z.string().url().default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().min(3).default("Cuspal <no-reply@cuspal.test>"),
  S3_ENDPOINT: z.string().url().default("http://127.0.0.1:4569"),
  S3_BUCKET: z.string().min(3).default("cuspal-documents"),
  S3_REGION: z.string().default("us-east-1"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  SEAL_CERT_PATH: z.string().optional(),
  /** Proxies whose X-Forwarded-For hops are believed: comma-separated IPs or CIDRs (lib/server/client-ip.ts). */
  TRUSTED_PROXIES: z.string().default(""),
  SEAL_CERT_PASSWORD: z.string().optional(),
});

export type Env = z.infer<typeof schema>;
let cached: Env | undefined;

export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Cuspal is not configured:\n${lines}\nStart it with \`npm run demo\`, which sets these.`);
  }
  cached = parsed.data;
  return cached;
}
