import type { Metadata } from "next";
import Link from "next/link";
import QRCode from "qrcode";
import { Brand } from "@/components/brand";
import { SignOutButton } from "@/components/sign-out-button";
import { pendingEnrolment } from "@/lib/auth/account";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { EnrolForm } from "./enrol-form";

export const metadata: Metadata = { title: "Two-factor sign-in" };
// Each visit may make a secret: never cached or prerendered.
export const dynamic = "force-dynamic";

export default async function TwoFactorPage() {
  const user = await requirePageUser(STAFF_ROLES, { allowSetup: true });
  const enrolment = await pendingEnrolment(user.id, user.email);
  const qr = enrolment === "enrolled" ? "" : await QRCode.toString(enrolment.uri, { type: "svg", margin: 1 });
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand href="/clinic" />
      <section className="card space-y-4">
        <h1 className="text-2xl font-bold">Two-factor sign-in</h1>
        {enrolment === "enrolled" ? (
          <>
            <p>Two-factor sign-in is on for your account. Each sign-in asks for the code your authenticator app shows.</p>
            <Link href="/clinic" className="btn-primary inline-block no-underline">Back to the clinic</Link>
          </>
        ) : (
          <>
            {user.setupTwoFactor ? (
              <p role="status" className="rounded-lg bg-clay-50 p-3 text-sm text-clay-700">
                Your clinic asks staff to sign in with a code from their phone as well as their password. Set it up to continue.
              </p>
            ) : null}
            {/* The SVG is made on the server by the qrcode package from our own URI: no user input inside. */}
            <EnrolForm qrSvg={qr} secret={enrolment.secret.replace(/(.{4})/g, "$1 ").trim()} />
          </>
        )}
        <div className="border-t border-line pt-3"><SignOutButton /></div>
      </section>
    </main>
  );
}
