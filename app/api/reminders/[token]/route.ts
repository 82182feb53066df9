// Turning a visit's reminders off (or back on) with the signed link from a reminder e-mail.
// POST only: mail programs send the one-click POST of RFC 8058 (List-Unsubscribe-Post), our
// link page posts its form here. A GET never changes anything (link scanners follow GETs).
import { NextResponse, type NextRequest } from "next/server";
import { setRemindersByToken } from "@/lib/data/mail";
import { clientInfo, JSON_BODY_LIMIT, readForm, readJson, route } from "@/lib/server/api";
import { mediaType } from "@/lib/server/request-policy";
import { reminderFormBody, reminderJsonBody } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };

export const POST = route<Ctx>(async (req: NextRequest, { params }) => {
  const { token } = await params;
  let enabled: boolean;
  let fromPage = false;
  if (mediaType(req.headers.get("content-type")) === "application/json") {
    enabled = (await readJson(req, reminderJsonBody)).enabled;
  } else {
    // Anyone may post here (the token is the authority), so the form is read under the same cap.
    const form = await readForm(req, JSON_BODY_LIMIT);
    if (form.get("List-Unsubscribe") === "One-Click") {
      enabled = false;
    } else {
      enabled = reminderFormBody.parse({ enabled: form.get("enabled") }).enabled === "true";
      fromPage = true;
    }
  }
  const result = await setRemindersByToken({ token, enabled, ...clientInfo(req) });
  if (fromPage) {
    const url = new URL(`/reminders/${encodeURIComponent(token)}?done=${result.remindersEnabled ? "on" : "off"}`, process.env.APP_URL ?? req.url);
    return NextResponse.redirect(url, 303);
  }
  return NextResponse.json({ remindersEnabled: result.remindersEnabled });
}, { body: "form-or-json" });

export const GET = route<Ctx>(async (req, { params }) => {
  const { token } = await params;
  return NextResponse.redirect(new URL(`/reminders/${encodeURIComponent(token)}`, process.env.APP_URL ?? req.url), 303);
});
