import { describe, expect, it } from "vitest";
import { MODEL_SCHEMES } from "../../db/seeds/demo-cast";
import { SCALE_MODELS } from "../../db/seeds/scale/models";

// The scale seed draws every unit from these lines, so checking each line checks every unit it can make.
describe("scale seed model lines", () => {
  it("follow their maker's own scheme", () => {
    for (const m of SCALE_MODELS) {
      const scheme = MODEL_SCHEMES[m.maker];
      expect(scheme, `${m.maker} has a numbering scheme`).toBeDefined();
      expect(m.model, `${m.maker} ${m.model}`).toMatch(scheme.pattern);
      expect(m.model, `${m.maker} ${m.model}`).not.toMatch(/^[A-Z][A-Za-z]{0,2}-\d/);
    }
  });

  it("come from every demo maker and cover every category", () => {
    expect(new Set(SCALE_MODELS.map((m) => m.maker))).toEqual(new Set(Object.keys(MODEL_SCHEMES)));
    expect(new Set(SCALE_MODELS.map((m) => m.category)).size).toBe(8);
  });
});
