import type { Metadata } from "next";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Clinic" };

const INTRO = {
  reception: "Visit requests to confirm and today's visits will appear here.",
  dentist: "Today's crown visits, their consents and timelines will appear here.",
  admin: "Materials, opening hours, equipment and staff settings will appear here.",
  patient: "",
} as const;

export default async function ClinicHomePage() {
  const user = await requirePageUser(STAFF_ROLES);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Clinic home</h1>
      <section className="card">
        <p className="text-ink-soft">{INTRO[user.role]}</p>
      </section>
    </div>
  );
}
