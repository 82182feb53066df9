// next-auth configuration: e-mail + password for everyone, an e-mail sign-in link for patients.
// Sessions are signed JWT cookies, so any app instance can read them.
import SequelizeAdapter from "@next-auth/sequelize-adapter";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { User } from "@/db/models";
import { sequelize } from "@/db/sequelize";
import type { Role } from "@/db/models/user";
import { recordPatientSignIn } from "@/lib/data/patient-invitations";
import { sendSignInLink } from "@/lib/mail/sign-in-link";
import { DUMMY_HASH, verifyPassword } from "./password";
import { clearFailures, recordFailure, tooManyFailures } from "./rate-limit";
import { SIGN_IN_FAILED, SIGN_IN_LOCKED, signInSchema } from "./schemas";

function ipOf(headers: Record<string, string | string[] | undefined> | undefined): string {
  const raw = headers?.["x-forwarded-for"] ?? headers?.["x-real-ip"];
  const first = (Array.isArray(raw) ? raw[0] : raw)?.split(",")[0]?.trim();
  return first || "unknown";
}

export const authOptions: NextAuthOptions = {
  // Our User model carries role and password hash beyond the adapter's own fields.
  adapter: SequelizeAdapter(sequelize, { models: { User: User as unknown as never }, synchronize: false }),
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-mail", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      id: "credentials",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error(SIGN_IN_FAILED);
        const { email, password } = parsed.data;
        const ip = ipOf(req?.headers as Record<string, string> | undefined);
        if (await tooManyFailures(email, ip)) throw new Error(SIGN_IN_LOCKED);
        const user = await User.findOne({ where: { email, active: true } });
        const ok = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
        if (!user || !user.passwordHash || !ok) {
          await recordFailure(email, ip);
          throw new Error(SIGN_IN_FAILED);
        }
        await clearFailures(email);
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
    // Others see the same "check your e-mail" page, so the form does not reveal who has an account.
    async signIn({ user, account }) {
      if (account?.provider !== "email") return true;
      const found = await User.findOne({ where: { email: String(user.email ?? "").toLowerCase() } });
      return found && found.active && found.role === "patient" ? true : "/sign-in/check-mail";
    },
    async jwt({ token, user }) {
      if (user) {
        const row = await User.findByPk(user.id);
        if (row) {
          token.role = row.role;
          token.clinicId = row.clinicId;
          token.name = row.name;
        }
      }
      return token;
    },
    async session({ session, token }) {
      session.user = {
        id: token.sub!,
        email: token.email ?? "",
        name: (token.name as string | null) ?? null,
        role: token.role as Role,
        clinicId: (token.clinicId as string | null) ?? null,
      };
      return session;
    },
  },
};
