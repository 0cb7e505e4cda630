import { describe, expect, it } from "vitest";
import { basisPointsText, readSettingsForm, settingsFormValues } from "~/buying/settings-form";
import { readResolveForm, ShipForm } from "~/buying/order-forms";
import { CURRENCY_CODES } from "@shared/listing-input";

// The buying pages' form readers: the admin's settings (percent → basis points, minimum per currency
// in minor units, bounded timings) and the moderator's decision on a contested order.

function settingsForm(overrides: Record<string, string> = {}): FormData {
  const form = new FormData();
  const base: Record<string, string> = {
    feePercent: "8",
    auditionDays: "3",
    arrivalAssumedDays: "10",
    reservationMinutes: "30",
    offerHours: "48",
    offerCheckoutHours: "24",
  };
  for (const c of CURRENCY_CODES) base[`minimum.${c}`] = c === "JPY" ? "500" : "3.00";
  for (const [k, v] of Object.entries({ ...base, ...overrides })) form.append(k, v);
  return form;
}

describe("the marketplace settings form", () => {
  it("reads the fee in percent as basis points and each minimum in its currency's minor units", () => {
    const read = readSettingsForm(settingsForm({ feePercent: "8.5 %", "minimum.GBP": "2.5", "minimum.EUR": "3,50" }));
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    expect(read.value.feeBasisPoints).toBe(850);
    expect(read.value.feeMinimumMinor.GBP).toBe(250);
    expect(read.value.feeMinimumMinor.EUR).toBe(350);
    expect(read.value.feeMinimumMinor.JPY).toBe(500);
    expect(read.value).toMatchObject({
      auditionDays: 3,
      arrivalAssumedDays: 10,
      reservationMinutes: 30,
      offerHours: 48,
      offerCheckoutHours: 24,
    });
  });

  it("names each bad field and saves nothing", () => {
    const read = readSettingsForm(
      settingsForm({ feePercent: "45", auditionDays: "0", "minimum.JPY": "5.5", reservationMinutes: "half an hour" }),
    );
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(Object.keys(read.errors).sort()).toEqual(["auditionDays", "feePercent", "minimum.JPY", "reservationMinutes"]);
    expect(read.errors.feePercent).toMatch(/at most 30 %/);
    expect(read.errors.auditionDays).toBe("Between 1 and 30 days.");
    expect(read.errors["minimum.JPY"]).toMatch(/no decimals/);
  });

  it("refuses a missing or doubled field", () => {
    const form = settingsForm();
    form.delete("offerHours");
    form.append("auditionDays", "4");
    const read = readSettingsForm(form);
    expect(read.ok).toBe(false);
    if (!read.ok) expect(Object.keys(read.errors).sort()).toEqual(["auditionDays", "offerHours"]);
  });

  it("writes stored values back as the form shows them", () => {
    expect(basisPointsText(800)).toBe("8");
    expect(basisPointsText(850)).toBe("8.5");
    expect(basisPointsText(1025)).toBe("10.25");
    const values = settingsFormValues({
      feeBasisPoints: 825,
      feeMinimumMinor: { GBP: 300, JPY: 500 },
      auditionDays: 3,
      arrivalAssumedDays: 10,
      reservationMinutes: 30,
      offerHours: 48,
      offerCheckoutHours: 24,
    });
    expect(values.feePercent).toBe("8.25");
    expect(values["minimum.GBP"]).toBe("3");
    expect(values["minimum.JPY"]).toBe("500");
    expect(values["minimum.EUR"]).toBe("0");
    // What the form shows reads back to the same settings.
    const form = new FormData();
    for (const [k, v] of Object.entries(values)) form.append(k, v);
    const read = readSettingsForm(form);
    expect(read.ok && read.value.feeBasisPoints).toBe(825);
  });
});

describe("the ship form", () => {
  it("refuses an empty tracking number and odd characters", () => {
    const empty = ShipForm.safeParse({ carrier: "Palletline Freight", trackingNumber: "  " });
    expect(empty.success).toBe(false);
    expect(empty.error?.issues[0].path).toEqual(["trackingNumber"]);
    expect(ShipForm.safeParse({ carrier: "Palletline Freight", trackingNumber: "<b>1</b>" }).success).toBe(false);
    expect(ShipForm.safeParse({ carrier: "Palletline Freight", trackingNumber: " PLF-2026/00417 " }).data?.trackingNumber).toBe(
      "PLF-2026/00417",
    );
  });
});

describe("the moderator's decision", () => {
  const order = { currency: "GBP", totalMinor: 120_000, refundedMinor: 0 };
  const note = "The buyer's readings show 30 % less power into 8 Ω than the sheet.";
  it("release is no refund, a whole refund is what is left, a part refund is the amount typed", () => {
    expect(readResolveForm({ resolution: "release", note }, order)).toEqual({ ok: true, refundMinor: 0, note });
    expect(readResolveForm({ resolution: "refund_whole", note }, { ...order, refundedMinor: 20_000 })).toEqual({
      ok: true,
      refundMinor: 100_000,
      note,
    });
    expect(readResolveForm({ resolution: "refund_part", amount: "360.50", note }, order)).toEqual({ ok: true, refundMinor: 36_050, note });
  });
  it("requires the note and a part smaller than the whole", () => {
    const noNote = readResolveForm({ resolution: "release", note: "  " }, order);
    expect(noNote.ok === false && Object.keys(noNote.errors)).toEqual(["note"]);
    const tooMuch = readResolveForm({ resolution: "refund_part", amount: "1200", note }, order);
    expect(tooMuch.ok === false && tooMuch.errors.amount).toMatch(/whole refund/);
    const none = readResolveForm({ resolution: "refund_part", amount: "", note }, order);
    expect(none.ok === false && none.errors.amount).toBe("Type the amount to refund.");
  });
});
