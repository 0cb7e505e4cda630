import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";

// loadline_search_query: each typed word a prefix match, on its stem alone when the stem begins the word.

const tsquery = async (q: string) =>
  (await sequelize.query<{ t: string }>(`SELECT loadline_search_query($1)::text AS t`, { bind: [q], type: QueryTypes.SELECT }))[0].t;
const matched = async (where: string, q: string) =>
  (await sequelize.query<{ id: string }>(`SELECT id FROM listings WHERE ${where} ORDER BY id`, { bind: [q], type: QueryTypes.SELECT })).map(
    (r) => r.id,
  );

describe("loadline_search_query", () => {
  it("matches a word by its stem alone when the stem begins the word", async () => {
    expect(await tsquery("recapped")).toBe("'recap':*");
    expect(await tsquery("Amplifiers")).toBe("'amplifi':*");
    expect(await tsquery("valve")).toBe("'valv':*");
  });

  it("keeps the word and its stem when the stem does not begin the word, and the word when it has no stem", async () => {
    expect(await tsquery("battery")).toBe("'battery':* | 'batteri':*");
    expect(await tsquery("the")).toBe("'the':*");
    expect(await tsquery("recapped battery")).toBe("( 'battery':* | 'batteri':* ) & 'recap':*");
  });

  it("finds the same listings as the word-or-stem query it replaces", async () => {
    const stem = `(SELECT min(lexeme) FROM unnest(to_tsvector('english', $1)))`;
    const before = `search_doc @@ (($1 || ':*')::tsquery || (${stem} || ':*')::tsquery)`;
    let found = 0;
    for (const word of ["recapped", "amplifiers", "serviced", "turntables", "restored", "speakers"]) {
      const now = await matched(`search_doc @@ loadline_search_query($1)`, word);
      expect(now).toEqual(await matched(before, word));
      found += now.length;
    }
    expect(found).toBeGreaterThan(0);
  });
});
