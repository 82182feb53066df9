// next-auth configuration: e-mail + password for everyone (plus a one-time code for staff who use
// two-factor sign-in), an e-mail sign-in link for patients. Sessions are signed JWT cookies that
// any app instance can read; each use is checked against the account's row (lib/auth/account.ts),
// so turning an account off, changing its role or clinic, or "sign out everywhere" ends it.
import SequelizeAdapter from "@next-auth/sequelize-adapter";
import type { NextAuthOptions } from "next-auth";
import type { JWT } from "next-auth/jwt";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { User } from "@/db/models";
import { sequelize } from "@/db/sequelize";
import type { Role } from "@/db/models/user";
import { recordPatientSignIn } from "@/lib/data/patient-invitations";
import { sendSignInLink } from "@/lib/mail/sign-in-link";
import { recordAudit } from "@/lib/server/audit";
import { clientIpFrom } from "@/lib/server/client-ip";
import { accountState, checkSecondFactor, lifetimeFor, PATIENT_LIFETIME_SECONDS } from "./account";
import { DUMMY_HASH, verifyPassword } from "./password";
import { pruneCounters, signInSucceeded, takeSignInAttempt, takeSignInLink } from "./rate-limit";
import { CODE_FAILED, CODE_NEEDED, SIGN_IN_FAILED, SIGN_IN_LOCKED, signInSchema } from "./schemas";

type Headers = Record<string, string | string[] | undefined> | undefined;

/** Thrown from the jwt callback when a session must end; next-auth then clears the cookie. */
class SessionEnded extends Error {
  constructor(reason: string) {
    super(`session ended: ${reason}`);
  }
}

async function audit(action: string, user: { id: string; clinicId: string | null } | null, ip: string, headers: Headers, data: Record<string, unknown> = {}) {
  const ua = headers?.["user-agent"];
  await recordAudit({
    clinicId: user?.clinicId ?? null,
    actorUserId: user?.id ?? null,
    action,
    subjectType: "user",
    subjectId: user?.id ?? "unknown",
    ip,
    userAgent: (Array.isArray(ua) ? ua[0] : ua) ?? null,
    data,
  });
}

/** Why a token no longer stands for a valid session, or null while it does. */
export function sessionProblem(token: JWT, state: Awaited<ReturnType<typeof accountState>>, now = new Date()): string | null {
  if (!state) return "account gone";
  if (!state.active) return "account turned off";
  if (token.sv !== state.sessionVersion) return "signed out elsewhere or access changed";
  if (token.role !== state.role || (token.clinicId ?? null) !== state.clinicId) return "access changed";
  if (typeof token.authAt !== "number" || now.getTime() / 1000 - token.authAt > lifetimeFor(state.role)) return "lifetime over";
  return null;
}

/** Staff whose clinic requires two-factor sign-in and who have not set it up yet. */
export function mustSetUpTwoFactor(state: NonNullable<Awaited<ReturnType<typeof accountState>>>): boolean {
  return state.role !== "patient" && state.requireTwoFactor && !state.enrolled;
}

// Our User model carries role and password hash beyond the adapter's own fields. Made once: the
// adapter defines its other models on the connection.
const adapter = SequelizeAdapter(sequelize, { models: { User: User as unknown as never }, synchronize: false });

/** Options for one request; the client's IP is known for the sign-in link throttle. */
export function authOptionsFor(ip = "unknown"): NextAuthOptions {
  return {
    adapter,
    // Renewed on use; the absolute lifetime from sign-in (12 h staff, 30 days patients) is checked in `jwt`.
    session: { strategy: "jwt", maxAge: PATIENT_LIFETIME_SECONDS },
    pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-mail", error: "/sign-in" },
    logger: {
      error(code, metadata) {
        // An ended session is expected, not an error worth a stack trace.
        if (code === "JWT_SESSION_ERROR" && (metadata as { error?: unknown })?.error instanceof SessionEnded) return;
        if (code === "JWT_SESSION_ERROR" && String((metadata as { message?: string })?.message ?? "").startsWith("session ended")) return;
        console.error(`[next-auth] ${code}`, metadata instanceof Error ? metadata.message : (metadata as { message?: string })?.message ?? "");
      },
      warn() {},
      debug() {},
    },
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: {
          email: { label: "E-mail", type: "email" },
          password: { label: "Password", type: "password" },
          code: { label: "Code", type: "text" },
        },
        async authorize(credentials, req) {
          const parsed = signInSchema.safeParse(credentials ?? {});
          if (!parsed.success) throw new Error(SIGN_IN_FAILED);
          const { email, password, code } = parsed.data;
          const headers = req?.headers as Headers;
          const from = clientIpFrom(headers);
          const user = await User.findOne({ where: { email, active: true } });
          const who = user ? { id: user.id, clinicId: user.clinicId } : null;

          // Counted before the password is checked: a refused attempt is not checked at all.
          const throttle = await takeSignInAttempt(email, from);
          if (!throttle.allowed) {
            await audit("auth.sign_in_throttled", who, from, headers, { limit: throttle.limit, retryAfterSeconds: throttle.retryAfterSeconds });
            throw new Error(SIGN_IN_LOCKED);
          }
          const ok = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
          if (!user || !user.passwordHash || !ok) {
            await audit("auth.sign_in_failed", who, from, headers, { step: "password" });
            throw new Error(SIGN_IN_FAILED);
          }
          let method = "password";
          if (user.role !== "patient" && user.totpEnabledAt) {
            if (!code) throw new Error(CODE_NEEDED);
            const second = await checkSecondFactor(user.id, code);
            if (!second) {
              await audit("auth.sign_in_failed", who, from, headers, { step: "code" });
              throw new Error(CODE_FAILED);
            }
            method = `password+${second}`;
          }
          await signInSucceeded(email, from);
          // Old windows are useless; a few sign-ins in a hundred clear them out.
          if (Math.random() < 0.02) await pruneCounters();
          await audit("auth.sign_in", who, from, headers, { method });
          return { id: user.id, email: user.email, name: user.name, role: user.role, clinicId: user.clinicId };
        },
      }),
      EmailProvider({
        from: process.env.MAIL_FROM ?? "Cuspal <no-reply@cuspal.test>",
        server: process.env.SMTP_URL ?? "smtp://127.0.0.1:1025",
        maxAge: 30 * 60,
        sendVerificationRequest: ({ identifier, url }) => sendSignInLink({ to: identifier, url }),
      }),
    ],
    events: {
      // Staff see when an invited patient first and last signed in.
      async signIn({ user }) {
        if (user.id) await recordPatientSignIn(user.id);
      },
    },
    callbacks: {
      // The link is only for existing, active patients: nobody signs up by asking for a link.
      // Others, and requests over the limit, see the same "check your e-mail" page, so the form
      // reveals neither who has an account nor who is being throttled.
      async signIn({ user, account, email }) {
        if (account?.provider !== "email") return true;
        const address = String(user.email ?? "").toLowerCase();
        if (email?.verificationRequest) {
          const throttle = await takeSignInLink(address, ip);
          if (!throttle.allowed) {
            const found = await User.findOne({ where: { email: address }, attributes: ["id", "clinicId"] });
            await audit("auth.sign_in_link_throttled", found ? { id: found.id, clinicId: found.clinicId } : null, ip, undefined, { limit: throttle.limit });
            return "/sign-in/check-mail";
          }
        }
        const found = await User.findOne({ where: { email: address } });
        return found && found.active && found.role === "patient" ? true : "/sign-in/check-mail";
      },
      async jwt({ token, user }) {
        if (user) {
          const row = await User.findByPk(user.id);
          if (!row || !row.active) throw new SessionEnded("account turned off");
          token.role = row.role;
          token.clinicId = row.clinicId;
          token.name = row.name;
          token.sv = row.sessionVersion;
          token.authAt = Math.floor(Date.now() / 1000);
          token.setupTwoFactor = false;
          return token;
        }
        const state = token.sub ? await accountState(token.sub) : null;
        const problem = sessionProblem(token, state);
        if (problem) throw new SessionEnded(problem);
        token.setupTwoFactor = mustSetUpTwoFactor(state!);
        return token;
      },
      async session({ session, token }) {
        session.user = {
          id: token.sub!,
          email: token.email ?? "",
          name: (token.name as string | null) ?? null,
          role: token.role as Role,
          clinicId: (token.clinicId as string | null) ?? null,
          setupTwoFactor: token.setupTwoFactor === true,
        };
        return session;
      },
    },
  };
}

/** For reading sessions (getServerSession); sign-in requests build theirs per request. */
export const authOptions = authOptionsFor();
