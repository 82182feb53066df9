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
  SEAL_CERT_PASSWORD: z.string().optional(),
  // The payment service: the official SDK, pointed at the local fake by STRIPE_API_URL.
  STRIPE_SECRET_KEY: z.string().regex(/^sk_(test|live)_[A-Za-z0-9_-]{8,}$/, { message: "STRIPE_SECRET_KEY must be a secret key (sk_test_… or sk_live_…)" }),
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_[A-Za-z0-9_-]{8,}$/, { message: "STRIPE_WEBHOOK_SECRET must be a webhook signing secret (whsec_…)" }),
  STRIPE_API_URL: z.string().url({ message: "STRIPE_API_URL must be a URL such as http://127.0.0.1:12111" }).optional(),
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
