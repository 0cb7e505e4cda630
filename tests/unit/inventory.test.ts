import { describe, expect, it } from "vitest";
import { InventoryActionSchema, applyPercent, inventoryParams, readInventoryQuery } from "@shared/inventory";
import { formAction, parsePercent } from "~/inventory/form-action";

const ID = "aaaaaaaa-0000-4000-8000-00000000000a";

describe("a price changed by a percentage", () => {
  // Worked by hand: 124 900 × 0.9 = 112 410; 99 × 1.125 = 111.375 → 111; 99 × 1.005 = 99.495 → 99;
  // 1 × 1.5 = 1.5 → 2 (half away from zero); 185 000 yen × 0.95 = 175 750.
  it.each([
    [124_900, -10, "EUR", 112_410],
    [99, 12.5, "EUR", 111],
    [99, 0.5, "EUR", 99],
    [1, 50, "EUR", 2],
    [185_000, -5, "JPY", 175_750],
  ])("%i %s %% in %s → %i", (minor, percent, currency, expected) => {
    expect(applyPercent(minor, percent, currency)).toBe(expected);
  });

  it("refuses a result of zero or past the most a listing may ask", () => {
    expect(applyPercent(1, -90, "EUR")).toBeNull(); // 0.1 → 0
    expect(applyPercent(90_000_000, 200, "EUR")).toBeNull(); // 2 700 000 EUR > 1 000 000
  });

  it("takes at most two decimals and never 0 %", () => {
    expect(InventoryActionSchema.safeParse({ action: "reprice", ids: [ID], percent: 2.5 }).success).toBe(true);
    expect(InventoryActionSchema.safeParse({ action: "reprice", ids: [ID], percent: 2.555 }).success).toBe(false);
    expect(InventoryActionSchema.safeParse({ action: "reprice", ids: [ID], percent: 0 }).success).toBe(false);
    expect(InventoryActionSchema.safeParse({ action: "reprice", ids: [ID], percent: -95 }).success).toBe(false);
  });
});

describe("the table's URL state", () => {
  it("reads what it can and drops the rest", () => {
    expect(readInventoryQuery(new URLSearchParams("state=live&category=radio&sort=price&page=x&q=%20zk%20"))).toEqual({
      state: "live",
      category: undefined,
      q: "zk",
      sort: "price",
      dir: undefined,
      page: 1,
    });
  });

  it("writes only what differs from the defaults", () => {
    expect(inventoryParams({ sort: "updated", dir: "desc", page: 1 }).toString()).toBe("");
    expect(inventoryParams({ sort: "price", dir: "asc", page: 2, state: "draft" }).toString()).toBe(
      "state=draft&sort=price&dir=asc&page=2",
    );
  });
});

describe("the bulk bar's plain form", () => {
  const form = (pairs: [string, string][]) => {
    const f = new FormData();
    for (const [k, v] of pairs) f.append(k, v);
    return f;
  };

  it("reads percentages as typed", () => {
    expect(parsePercent("-10")).toBe(-10);
    expect(parsePercent("−7,5 %")).toBe(-7.5);
    expect(parsePercent("+5")).toBe(5);
    expect(parsePercent("ten")).toBeNull();
  });

  it("asks before withdrawing, then sends every ticked unit", () => {
    const ticked: [string, string][] = [
      ["intent", "withdraw"],
      ["ids", ID],
      ["ids", "bbbbbbbb-0000-4000-8000-00000000000b"],
    ];
    const first = formAction(form(ticked));
    expect(first.ok).toBe(false);
    expect(!first.ok && first.state.ok === false && first.state.confirm).toBe(true);
    expect(formAction(form([...ticked, ["confirm", "yes"]]))).toEqual({
      ok: true,
      action: { action: "withdraw", ids: [ID, "bbbbbbbb-0000-4000-8000-00000000000b"] },
    });
  });

  it("needs a selection and the action's figure", () => {
    expect(formAction(form([["intent", "publish"]])).ok).toBe(false);
    expect(
      formAction(
        form([
          ["intent", "handling"],
          ["ids", ID],
          ["handlingDays", "45"],
        ]),
      ).ok,
    ).toBe(false);
    expect(
      formAction(
        form([
          ["intent", "handling"],
          ["ids", ID],
          ["handlingDays", "4"],
        ]),
      ),
    ).toEqual({
      ok: true,
      action: { action: "handling", ids: [ID], handlingDays: 4 },
    });
  });
});
