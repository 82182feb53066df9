// Environment variables, validated once with zod so a missing setting fails with a clear message.
// In production (NODE_ENV=production) nothing may fall back to a local default: the storage keys
// must be set and must not be the published keys of the local storage fake, NEXTAUTH_SECRET must
// be long, and the clinic seal certificate must be configured. `npm run demo` and `npm test` run
// the built app in production mode too; they pass random secrets of their own (kept in .data) and
// start the storage fake with those keys, so they pass the same checks.
import { z } from "zod";

/** The keys every copy of the local storage fake (s3rver) accepts out of the box: never for real data. */
export const FAKE_STORAGE_KEY = "S3RVER";
export const MIN_PRODUCTION_SECRET = 32;

const stripeKey = z.string().regex(/^sk_(test|live)_[A-Za-z0-9_-]{8,}$/, { message: "STRIPE_SECRET_KEY must be a secret key (sk_test_… or sk_live_…)" });
const webhookSecret = z.string().regex(/^whsec_[A-Za-z0-9_-]{8,}$/, { message: "STRIPE_WEBHOOK_SECRET must be a webhook signing secret (whsec_…)" });

const base = z.object({
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a PostgreSQL URL" }),
  NEXTAUTH_SECRET: z.string().min(16, { message: "NEXTAUTH_SECRET must be at least 16 characters" }),
  APP_URL: z.string().url().default("http://localhost:3000"),
  SMTP_URL: z.string().url().default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().min(3).default("Cuspal <no-reply@cuspal.test>"),
  S3_ENDPOINT: z.string().url().default("http://127.0.0.1:4569"),
  S3_BUCKET: z.string().min(3).default("cuspal-documents"),
  S3_REGION: z.string().default("us-east-1"),
  S3_ACCESS_KEY_ID: z.string().default(FAKE_STORAGE_KEY),
  S3_SECRET_ACCESS_KEY: z.string().default(FAKE_STORAGE_KEY),
  SEAL_CERT_PATH: z.string().optional(),
  /** Proxies whose X-Forwarded-For hops are believed: comma-separated IPs or CIDRs (lib/server/client-ip.ts). */
  TRUSTED_PROXIES: z.string().default(""),
  SEAL_CERT_PASSWORD: z.string().optional(),
  // The payment service: the official SDK, pointed at the local fake by STRIPE_API_URL.
  // Optional on a developer's machine (payments then answer with a clear error); required in production.
  STRIPE_SECRET_KEY: stripeKey.optional(),
  STRIPE_WEBHOOK_SECRET: webhookSecret.optional(),
  STRIPE_API_URL: z.string().url({ message: "STRIPE_API_URL must be a URL such as http://127.0.0.1:12111" }).optional(),
});

const present = (name: string) => z.string({ message: `${name} must be set in production` }).min(1, { message: `${name} must be set in production` });
const notFake = (name: string) =>
  present(name).refine((v) => v !== FAKE_STORAGE_KEY, { message: `${name} is the local storage fake's published key; set your storage's real key` });

// Production: the same fields, without the defaults that only make sense on a developer's machine.
const production = base.extend({
  NEXTAUTH_SECRET: present("NEXTAUTH_SECRET").min(MIN_PRODUCTION_SECRET, {
    message: `NEXTAUTH_SECRET must be at least ${MIN_PRODUCTION_SECRET} random characters in production (e.g. \`openssl rand -base64 32\`)`,
  }),
  S3_ACCESS_KEY_ID: notFake("S3_ACCESS_KEY_ID"),
  S3_SECRET_ACCESS_KEY: notFake("S3_SECRET_ACCESS_KEY"),
  SEAL_CERT_PATH: present("SEAL_CERT_PATH"),
  SEAL_CERT_PASSWORD: present("SEAL_CERT_PASSWORD"),
  STRIPE_SECRET_KEY: present("STRIPE_SECRET_KEY").pipe(stripeKey),
  STRIPE_WEBHOOK_SECRET: present("STRIPE_WEBHOOK_SECRET").pipe(webhookSecret),
});

export type Env = z.infer<typeof base>;
let cached: Env | undefined;

/** Validates `source` (process.env by default); throws one message listing every problem. */
export function parseEnv(source: Record<string, string | undefined> = process.env): Env {
  const isProduction = source.NODE_ENV === "production";
  const parsed = (isProduction ? production : base).safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    const hint = isProduction
      ? "Production refuses local defaults; see “Running in production” in README.md."
      : "Start it with `npm run demo`, which sets these.";
    throw new Error(`Cuspal is not configured:\n${lines}\n${hint}`);
  }
  return parsed.data;
}

export function env(): Env {
  cached ??= parseEnv();
  return cached;
}
