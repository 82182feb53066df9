// The signed token in "turn off reminders" links.
import { describe, expect, it } from "vitest";
import { linkMatchesVisit, reminderLinkExpiry, reminderToken, verifyReminderToken } from "@/lib/mail/reminder-token";

const SECRET = "a-test-secret-that-is-long-enough";
const ID = "2f1d7c64-8a7e-4c1b-9a59-0d6b3c2e4f10";
const STARTS = new Date("2030-03-04T14:30:00Z");
const DAY = 24 * 3600 * 1000;
const opts = (now = new Date("2030-03-01T00:00:00Z")) => ({ secret: SECRET, now });

describe("reminder link token", () => {
  it("verifies its own tokens and returns the visit id", () => {
    expect(verifyReminderToken(reminderToken(ID, STARTS, SECRET), opts())?.id).toBe(ID);
  });

  it("rejects a token for another visit, another secret, or a changed signature or expiry", () => {
    const token = reminderToken(ID, STARTS, SECRET);
    const other = "9a0c1e2d-3b4f-4a5b-8c6d-7e8f9a0b1c2d";
    const [, exp, mac] = token.split(".");
    expect(verifyReminderToken(`${other}.${exp}.${mac}`, opts())).toBeNull();
    expect(verifyReminderToken(`${ID}.${Number(exp) + 86400}.${mac}`, opts())).toBeNull();
    expect(verifyReminderToken(token, { ...opts(), secret: "another-secret-that-is-long-enough" })).toBeNull();
    const flipped = mac.slice(0, -1) + (mac.endsWith("A") ? "B" : "A");
    expect(verifyReminderToken(`${ID}.${exp}.${flipped}`, opts())).toBeNull();
    expect(verifyReminderToken(`${token}.x`, opts())).toBeNull();
    expect(verifyReminderToken("nonsense", opts())).toBeNull();
    expect(verifyReminderToken("", opts())).toBeNull();
  });

  it("expires 30 days after the visit", () => {
    const token = reminderToken(ID, STARTS, SECRET);
    expect(reminderLinkExpiry(STARTS) * 1000 - STARTS.getTime()).toBe(30 * DAY);
    expect(verifyReminderToken(token, opts(new Date(STARTS.getTime() + 30 * DAY - 1000)))?.id).toBe(ID);
    expect(verifyReminderToken(token, opts(new Date(STARTS.getTime() + 30 * DAY)))).toBeNull();
    expect(verifyReminderToken(token, opts(new Date(STARTS.getTime() + 400 * DAY)))).toBeNull();
  });

  it("is replaced when the visit moves: the old link no longer matches the visit", () => {
    const old = verifyReminderToken(reminderToken(ID, STARTS, SECRET), opts())!;
    const moved = new Date(STARTS.getTime() + 2 * DAY);
    expect(linkMatchesVisit(old, { startsAt: STARTS })).toBe(true);
    expect(linkMatchesVisit(old, { startsAt: moved })).toBe(false);
    expect(linkMatchesVisit(verifyReminderToken(reminderToken(ID, moved, SECRET), opts())!, { startsAt: moved })).toBe(true);
  });

  it("refuses to sign without a real secret", () => {
    expect(() => reminderToken(ID, STARTS, "short")).toThrow(/NEXTAUTH_SECRET/);
  });
});
