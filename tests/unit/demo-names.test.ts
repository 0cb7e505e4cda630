import { describe, expect, it } from "vitest";
import { DEMO_UNITS, MODEL_SCHEMES } from "../../db/seeds/demo-data";

// The demo scenario's makers are invented, and so are their numbering schemes: every model follows
// its maker's own scheme, and none uses the letter-pair-hyphen-digits shape of the era's real ranges.
describe("demo model names", () => {
  it("follow their maker's own scheme", () => {
    for (const unit of DEMO_UNITS) {
      const scheme = MODEL_SCHEMES[unit.maker];
      expect(scheme, `${unit.maker} has a numbering scheme`).toBeDefined();
      expect(unit.model, `${unit.maker} ${unit.model}`).toMatch(scheme.pattern);
      if (unit.sheet) expect(unit.sheet.equipment).toMatchObject({ maker: unit.maker, model: unit.model.replace(/ \(pair\)$/, "") });
    }
  });

  it("give each maker a scheme of its own", () => {
    for (const [maker, { scheme }] of Object.entries(MODEL_SCHEMES)) {
      const others = Object.entries(MODEL_SCHEMES).filter(([m]) => m !== maker);
      expect(
        others.filter(([, o]) => o.pattern.test(scheme)).map(([m]) => m),
        `${maker}'s ${scheme}`,
      ).toEqual([]);
    }
  });

  it("never read like a letter prefix, a hyphen and a number", () => {
    expect(DEMO_UNITS.map((u) => u.model).filter((m) => /^[A-Z][A-Za-z]{0,2}-\d/.test(m))).toEqual([]);
  });
});
