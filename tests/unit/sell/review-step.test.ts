import { describe, expect, it } from "vitest";
import { checklistHeading } from "~/sell/review-words";
import { LISTING_STATUSES } from "@shared/catalogue";
import { publishChecklist, type ChecklistInput } from "@shared/publish-checklist";

// The review step after publishing: its heading says where the listing stands, and its checklist
// names only what applies to the unit.

describe("the review step's heading", () => {
  it("speaks of going on the market only before publishing", () => {
    expect(checklistHeading("draft").title).toBe("Before it goes on the market");
    for (const status of LISTING_STATUSES.filter((s) => s !== "draft" && s !== "withdrawn"))
      expect(checklistHeading(status).title, status).not.toMatch(/before it goes/i);
    expect(checklistHeading("live").title).toBe("On the market");
    expect(checklistHeading("held").title).toMatch(/review desk/);
  });
});

describe("the checklist of a serviced unit with no fault", () => {
  const serviced: ChecklistInput = {
    listing: {
      maker: "Harrowgate Sound",
      model: "120-HG",
      priceMinor: 125_000,
      country: "GB",
      weightG: 14_200,
      shippingOptions: [{ method: "parcel", prices: { domestic: 1500 } }],
      handlingDays: 3,
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      conditionNote: null,
    },
    sheet: { readings: 4, measured: 4 },
    restorationEntries: 1,
    photos: { ready: 3, processing: 0, failed: 0 },
    emailVerified: true,
  };

  it("does not tick off “The fault, described”", () => {
    const labels = publishChecklist(serviced).map((c) => c.label);
    expect(labels).not.toContain("The fault, described");
    expect(labels).toEqual(expect.arrayContaining(["Restoration log", "Bench sheet", "Handling time"]));
    expect(publishChecklist(serviced).every((c) => c.ok)).toBe(true);
  });
});
