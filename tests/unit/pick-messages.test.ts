// Picking the messages a page's client components read: whole namespaces or one part of one.
import { describe, expect, it } from "vitest";
import { pickMessages } from "@/components/i18n/pick-messages";

const ALL = {
  booking: { title: "Book", pick: "Pick {thing}" },
  payments: { planSummary: "Plan?", planForm: { saved: "Saved", coverage: { label: "Coverage" } }, desk: { paid: "Paid" } },
  common: { cancel: "Cancel" },
};

describe("pickMessages", () => {
  it("keeps the named namespaces whole and leaves the rest out", () => {
    expect(pickMessages(ALL, ["booking"])).toEqual({ booking: ALL.booking });
  });
  it("keeps a nested part in the same shape, without its siblings", () => {
    expect(pickMessages(ALL, ["booking", "payments.planForm"])).toEqual({ booking: ALL.booking, payments: { planForm: ALL.payments.planForm } });
  });
  it("skips names that are not in the catalogue", () => {
    expect(pickMessages(ALL, ["nothing", "payments.nothing"])).toEqual({});
  });
});
