// Reminder timing and message keys (pure functions).
import { describe, expect, it } from "vitest";
import {
  DEFAULT_REMINDER_HOURS, durationWords, idempotencyKey, planReminders, reminderHours, reminderStillUseful, timeUntilWords,
} from "@/lib/domain/reminders";

const H = 3_600_000;
const start = new Date("2027-03-15T14:00:00Z");

describe("reminder hours", () => {
  it("defaults to 48 h and 2 h before ([C] common practice, REFERENCES.md)", () => {
    expect(DEFAULT_REMINDER_HOURS).toEqual([48, 2]);
    expect(reminderHours(undefined)).toEqual([48, 2]);
    expect(reminderHours([])).toEqual([48, 2]);
  });

  it("cleans a clinic setting: whole positive hours, largest first, no repeats", () => {
    expect(reminderHours([2, 24, 2, "x", -1, 0, 1.5, 24])).toEqual([24, 2]);
    expect(reminderHours([72])).toEqual([72]);
    expect(reminderHours(["not a list"])).toEqual([48, 2]);
  });
});

describe("planning reminders at confirmation", () => {
  it("puts each reminder the given hours before the start", () => {
    const plan = planReminders(start, [48, 2], new Date("2027-03-01T00:00:00Z"));
    expect(plan.map((p) => [p.hoursBefore, p.dueAt.toISOString(), p.skip])).toEqual([
      [48, "2027-03-13T14:00:00.000Z", false],
      [2, "2027-03-15T12:00:00.000Z", false],
    ]);
  });

  it("skips a reminder whose time has already passed (or is exactly now) instead of sending it late", () => {
    const tenHoursBefore = new Date(start.getTime() - 10 * H);
    expect(planReminders(start, [48, 2], tenHoursBefore).map((p) => p.skip)).toEqual([true, false]);
    const exactly = new Date(start.getTime() - 2 * H);
    expect(planReminders(start, [48, 2], exactly).map((p) => p.skip)).toEqual([true, true]);
  });
});

describe("a reminder picked up late", () => {
  const r = { dueAt: new Date(start.getTime() - 48 * H), visitStartsAt: start };
  it("is still sent when no later reminder is due yet", () => {
    expect(reminderStillUseful(r, [new Date(start.getTime() - 2 * H)], new Date(start.getTime() - 30 * H))).toBe(true);
  });
  it("is dropped when a later reminder is due too, or the visit has started", () => {
    expect(reminderStillUseful(r, [new Date(start.getTime() - 2 * H)], new Date(start.getTime() - 1 * H))).toBe(false);
    expect(reminderStillUseful(r, [], start)).toBe(false);
  });
});

describe("message keys and words", () => {
  it("names visit, kind and start time", () => {
    expect(idempotencyKey("v1", "reminder-2h", start)).toBe("v1/reminder-2h/2027-03-15T14:00:00.000Z");
    expect(idempotencyKey("v1", "reminder-2h", new Date(start.getTime() + H))).not.toBe(idempotencyKey("v1", "reminder-2h", start));
  });
  it("says how long and how far off in plain words", () => {
    expect(durationWords(150)).toBe("2 hours 30 minutes");
    expect(durationWords(60)).toBe("1 hour");
    expect(durationWords(45)).toBe("45 minutes");
    expect(timeUntilWords(new Date(start.getTime() - 48 * H), start)).toBe("in 2 days");
    expect(timeUntilWords(new Date(start.getTime() - 2 * H), start)).toBe("in about 2 hours");
    expect(timeUntilWords(new Date(start.getTime() - 50 * 60_000), start)).toBe("in about 50 minutes");
  });
});
