import { describe, expect, it } from "vitest";
import { eventNote } from "~/buying/event-notes";

// What each side reads on an order's timeline: the desk sees the provider's ids, buyers and sellers the words.
describe("order timeline notes", () => {
  it("names a contest's reason in words for everyone", () => {
    for (const viewer of ["buyer", "seller", "moderator"] as const) {
      expect(eventNote({ toState: "contested", note: "measures_below_sheet" }, viewer)).toBe("It measures worse than its bench sheet");
    }
  });
  it("keeps the provider's ids for the desk only", () => {
    const refund = { toState: "refunded", note: "Refunded €360.00 to the buyer (re_3Kx9AbCdEf)." };
    expect(eventNote(refund, "moderator")).toBe(refund.note);
    expect(eventNote(refund, "buyer")).toBe("Refunded €360.00 to the buyer.");
    const paid = { toState: "funded", note: "Payment pi_3x5Le5jLCeNQ2 (evt_xpayt4gpZDss)." };
    expect(eventNote(paid, "seller")).toBeNull();
    expect(eventNote(paid, "moderator")).toBe(paid.note);
  });
  it("leaves a person's note as written", () => {
    expect(eventNote({ toState: "shipped", note: "Sent on a pallet (two boxes)." }, "buyer")).toBe("Sent on a pallet (two boxes).");
  });
});
