import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { isOneOf } from "@shared/one-of";

describe("isOneOf", () => {
  const ZONES = ["domestic", "nearby", "worldwide"] as const;

  it("accepts exactly the list's members", () => {
    fc.assert(fc.property(fc.anything(), (value) => isOneOf(ZONES, value) === ZONES.some((z) => z === value)));
    for (const z of ZONES) expect(isOneOf(ZONES, z)).toBe(true);
    expect(isOneOf(ZONES, "Domestic")).toBe(false);
  });
});
