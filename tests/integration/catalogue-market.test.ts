import { beforeAll, describe, expect, it } from "vitest";
import { BenchSheet, Listing, ListingPhoto } from "~/models/index.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { homeData, liveCountsByCategory, marketPage, parseMarketSearch } from "~/catalogue/market.server";
import { mediaResponse } from "~/catalogue/media.server";
import { sequelize } from "~/db.server";
import { seedDemo } from "../../db/seeds/demo";

// What buyers browse: only live listings, in the category asked for, newest first; photos served
// from object storage with a long cache, originals never.

beforeAll(async () => {
  await ensureBucket();
  await seedDemo();
}, 240_000);

const search = (qs: string) => parseMarketSearch(new URL(`http://loadline.test/market${qs}`));

describe("market", () => {
  it("lists only live listings, newest first", async () => {
    const page = await marketPage(search(""), 500);
    expect(page.items.length).toBe(await Listing.count({ where: { status: "live" } }));
    const statuses = await Listing.findAll({ where: { id: page.items.map((i) => i.id) }, attributes: ["status"], raw: true });
    expect(new Set(statuses.map((s) => s.status))).toEqual(new Set(["live"]));
    const times = page.items.map((i) => Date.parse(i.publishedAt));
    expect(times).toEqual([...times].sort((a, b) => b - a));
    // Held, draft, sold and withdrawn demo units stay out.
    const hidden = await Listing.findAll({ where: { status: ["held", "draft", "sold", "withdrawn"] }, attributes: ["id"], raw: true });
    expect(hidden.length).toBeGreaterThan(0);
    const shown = new Set(page.items.map((i) => i.id));
    expect(hidden.filter((h) => shown.has(h.id))).toEqual([]);
  });

  it("filters by category and pages through it", async () => {
    const first = await marketPage(search("?category=turntables"), 2);
    expect(first.category).toBe("turntable");
    expect(first.items.every((i) => i.category === "turntable")).toBe(true);
    const live = await Listing.count({ where: { status: "live", category: "turntable" } });
    expect(first.total).toBe(live);
    expect(first.pageCount).toBe(Math.ceil(live / 2));
    const second = await marketPage(search("?category=turntables&page=2"), 2);
    expect(second.items.map((i) => i.id)).not.toEqual(expect.arrayContaining(first.items.map((i) => i.id)));
  });

  it("falls back to all categories and page 1 for unknown parameters", async () => {
    const page = await marketPage(search("?category=jukeboxes&page=-3"), 5);
    expect(page.category).toBeNull();
    expect(page.page).toBe(1);
  });

  it("shows a bench-verified amplifier with its figure, unit and conditions, and no serial number", async () => {
    const page = await marketPage(search("?category=integrated-amplifiers"), 500);
    const amp = page.items.find((i) => i.title === "Carrowain WQ 46i");
    expect(amp).toBeDefined();
    expect(amp!.benchVerified).toBe(true);
    expect(amp!.keyFigure).toEqual({
      label: "Power into 8 Ω",
      value: "65",
      unit: "W",
      conditions: "into 8 Ω, 1 kHz, 0.1 % THD, both channels driven",
    });
    expect(amp!.cover?.thumbUrl).toMatch(/^\/media\/photos\/thumb\//);
    expect(JSON.stringify(page)).not.toContain("CW-46I-017924");
  });

  it("loads a page of cards in a fixed number of queries, reading only the columns a card shows", async () => {
    const statements = async (run: () => Promise<unknown>) => {
      const seen: string[] = [];
      // Every statement goes through the logging option (typed only on the constructor's options).
      const options = (sequelize as unknown as { options: { logging: unknown } }).options;
      const before = options.logging;
      // The market epoch is read at most once a second, so whether a call reads it depends on the clock.
      options.logging = (sql: string) => void (sql.includes("market_epoch") || seen.push(sql));
      try {
        await run();
      } finally {
        options.logging = before;
      }
      return seen;
    };
    await marketPage(search(""), 500); // the counts and the cards' lead figures, kept until they change
    const one = await statements(() => marketPage(search(""), 1));
    const many = await statements(() => marketPage(search(""), 500));
    const home = await statements(() => homeData(6));
    expect(await Listing.count({ where: { status: "live" } })).toBeGreaterThan(20);
    // The page's ids with each card's columns, seller, workshop, sheet version and cover: one statement.
    expect(many.length).toBe(1);
    expect(one.length).toBe(many.length);
    expect(home.length).toBeLessThanOrEqual(5);
    // Home takes its totals from the market's kept counts: no count over the listings on each visit.
    expect(home.filter((sql) => /count\(/i.test(sql) && /listings/i.test(sql))).toEqual([]);
    expect(many[0]).toMatch(/LEFT JOIN bench_sheets s ON s\.listing_id = l\.id/);
    const cards = [...many, ...home.filter((sql) => sql.includes('FROM "listings" AS "Listing"') && sql.includes("LEFT OUTER JOIN"))];
    expect(cards.length).toBe(2);
    for (const sql of cards) {
      // A card needs neither the shipping options, the condition note, the postcode nor the bench verdict.
      expect(sql).not.toMatch(/"Listing"\."(shipping_options|condition_note|postcode)"|\bl\.(shipping_options|condition_note|postcode)\b/);
      expect(sql).not.toMatch(/"benchSheet"\."verdict"|\bs\.(verdict|sheet)\b/);
    }
  });

  it("shows a sheet's new lead figure once the sheet is saved again", async () => {
    const amp = (await marketPage(search("?category=integrated-amplifiers"), 500)).items.find((i) => i.title === "Carrowain WQ 46i")!;
    expect(amp.keyFigure?.value).toBe("65");
    const bench = (await BenchSheet.findOne({ where: { listingId: amp.id } }))!;
    const before = bench.sheet!;
    const at8 = (x: (typeof before.readings)[number]) =>
      x.quantity === "output_power" && x.basis === "measured" && x.conditions.loadOhm === 8;
    try {
      await bench.update({ sheet: { ...before, readings: before.readings.map((x) => (at8(x) ? { ...x, value: 61 } : x)) } });
      const after = (await marketPage(search("?category=integrated-amplifiers"), 500)).items.find((i) => i.id === amp.id)!;
      expect(after.keyFigure?.value).toBe("61");
    } finally {
      await bench.update({ sheet: before });
    }
  });

  it("counts live units per category the same way the market lists them", async () => {
    const counts = await liveCountsByCategory();
    for (const c of counts) expect(c.live).toBe(await Listing.count({ where: { status: "live", category: c.category } }));
    const home = await homeData(6);
    expect(home.counts).toEqual(counts);
    expect(home.totals.benchVerified).toBe(await Listing.count({ where: { status: "live", benchVerified: true } }));
    expect(home.recentVerified.length).toBeGreaterThan(0);
    expect(home.recentVerified.every((l) => l.benchVerified)).toBe(true);
  });
});

describe("/media", () => {
  it("serves a thumbnail with a year-long cache, and refuses originals and made-up keys", async () => {
    const page = await marketPage(search("?category=integrated-amplifiers"), 500);
    const url = page.items.find((i) => i.title === "Carrowain WQ 46i")!.cover!.thumbUrl;
    const key = url.replace(/^\/media\//, "");
    const res = await mediaResponse(key, new Request(`http://loadline.test${url}`));
    expect(res.status).toBe(200);
    expect(res.headers.get("Content-Type")).toBe("image/jpeg");
    expect(res.headers.get("Cache-Control")).toContain("max-age=31536000");
    const body = new Uint8Array(await res.arrayBuffer());
    expect([body[0], body[1]]).toEqual([0xff, 0xd8]); // JPEG start-of-image

    const again = await mediaResponse(
      key,
      new Request(`http://loadline.test${url}`, { headers: { "If-None-Match": res.headers.get("ETag")! } }),
    );
    expect(again.status).toBe(304);

    // The original exists in storage but may carry a camera's metadata: never served.
    const photo = await ListingPhoto.findOne({ where: { thumbKey: key } });
    expect(await headObject(photo!.originalKey)).not.toBeNull();
    expect((await mediaResponse(photo!.originalKey, new Request("http://loadline.test/"))).status).toBe(404);
    expect((await mediaResponse("photos/thumb/../../originals/x.jpg", new Request("http://loadline.test/"))).status).toBe(404);
    expect(
      (await mediaResponse("photos/thumb/2026/01/00000000-0000-0000-0000-000000000000.jpg", new Request("http://loadline.test/"))).status,
    ).toBe(404);
  });
});
