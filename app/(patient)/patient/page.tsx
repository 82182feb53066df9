import type { Metadata } from "next";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "My crown" };

export default async function PatientHomePage() {
  const user = await requirePageUser(["patient"]);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Hello, {user.name?.split(" ")[0] ?? "there"}</h1>
      <section className="card">
        <h2 className="text-lg font-semibold">Your crown proposals</h2>
        <p className="mt-2 text-ink-soft">When your dentist proposes a crown, it appears here with the materials you can choose from.</p>
      </section>
      <CautionsNote />
    </div>
  );
}
