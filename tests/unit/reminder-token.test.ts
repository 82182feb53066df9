// The signed token in "turn off reminders" links.
import { describe, expect, it } from "vitest";
import { reminderToken, verifyReminderToken } from "@/lib/mail/reminder-token";

const SECRET = "a-test-secret-that-is-long-enough";
const ID = "2f1d7c64-8a7e-4c1b-9a59-0d6b3c2e4f10";

describe("reminder link token", () => {
  it("verifies its own tokens and returns the visit id", () => {
    expect(verifyReminderToken(reminderToken(ID, SECRET), SECRET)).toBe(ID);
  });

  it("rejects a token for another visit, another secret, or a changed signature", () => {
    const token = reminderToken(ID, SECRET);
    const other = "9a0c1e2d-3b4f-4a5b-8c6d-7e8f9a0b1c2d";
    const [, mac] = token.split(".");
    expect(verifyReminderToken(`${other}.${mac}`, SECRET)).toBeNull();
    expect(verifyReminderToken(token, "another-secret-that-is-long-enough")).toBeNull();
    const flipped = mac.slice(0, -1) + (mac.endsWith("A") ? "B" : "A");
    expect(verifyReminderToken(`${ID}.${flipped}`, SECRET)).toBeNull();
    expect(verifyReminderToken(`${ID}.${mac}.x`, SECRET)).toBeNull();
    expect(verifyReminderToken("nonsense", SECRET)).toBeNull();
    expect(verifyReminderToken("", SECRET)).toBeNull();
  });

  it("refuses to sign without a real secret", () => {
    expect(() => reminderToken(ID, "short")).toThrow(/NEXTAUTH_SECRET/);
  });
});
