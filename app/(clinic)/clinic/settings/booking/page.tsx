import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { getBookingSettings } from "@/lib/data/settings";
import { BookingForm } from "./booking-form";

export const metadata: Metadata = { title: "Booking and reminders" };

export default async function BookingSettingsPage() {
  const user = await requirePageUser(["admin"]);
  const settings = await getBookingSettings({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Booking and reminders</h1>
      <section className="card"><BookingForm initial={{ ...settings, reminderHoursBefore: settings.reminderHoursBefore.join(", ") }} /></section>
    </div>
  );
}
