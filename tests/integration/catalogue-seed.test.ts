import { beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry, User, Workshop } from "~/models/index.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { verifyPassword } from "~/auth/password.server";
import { seedDemo } from "../../db/seeds/demo";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_UNITS, DEMO_WORKSHOPS } from "../../db/seeds/demo-data";

// The demo scenario loads once: `npm start` runs it on every start, so a second run must add
// nothing, change nothing and leave no stray photo objects.

const serials = DEMO_UNITS.map((u) => u.serial);
const emails = DEMO_ACCOUNTS.map((a) => a.email);

async function demoCounts() {
  const listings = await Listing.findAll({ where: { serialNumber: serials }, attributes: ["id", "updatedAt"], raw: true });
  const ids = listings.map((l) => l.id);
  return {
    users: await User.count({ where: { email: emails } }),
    workshops: await Workshop.count({ where: { slug: DEMO_WORKSHOPS.map((w) => w.slug) } }),
    listings: listings.length,
    photos: await ListingPhoto.count({ where: { listingId: ids } }),
    sheets: await BenchSheet.count({ where: { listingId: ids } }),
    logEntries: await RestorationEntry.count({ where: { listingId: ids } }),
    lastChange: Math.max(...listings.map((l) => new Date(l.updatedAt).getTime())),
  };
}

describe("demo scenario seed", () => {
  beforeAll(async () => {
    await ensureBucket();
    await seedDemo(); // loads it, unless the test stack already has
  }, 240_000);

  it("holds every invented account, workshop and unit exactly once", async () => {
    const counts = await demoCounts();
    expect(counts.users).toBe(DEMO_ACCOUNTS.length);
    expect(counts.workshops).toBe(DEMO_WORKSHOPS.length);
    expect(counts.listings).toBe(DEMO_UNITS.length);
    expect(counts.photos).toBe(DEMO_UNITS.reduce((n, u) => n + (u.photos ?? 1), 0));
    expect(counts.sheets).toBe(DEMO_UNITS.filter((u) => u.sheet).length);
  });

  it("a second and third run change nothing and duplicate nothing", async () => {
    const before = await demoCounts();
    const second = await seedDemo();
    const third = await seedDemo();
    expect(second.created).toBe(false);
    expect(third.created).toBe(false);
    expect(await demoCounts()).toEqual(before);
    expect(second.accounts.map((a) => a.email)).toEqual(emails);
  });

  it("demo accounts sign in with the documented password", async () => {
    for (const email of [
      "admin@loadline.test",
      "desk@loadline.test",
      "buyer@loadline.test",
      "workshop@loadline.test",
      "seller@loadline.test",
    ]) {
      const user = await User.findOne({ where: { email } });
      expect(user, email).not.toBeNull();
      expect(await verifyPassword(DEMO_PASSWORD, user!.passwordHash)).toBe(true);
      expect(user!.emailVerifiedAt).not.toBeNull();
    }
    const desk = await User.findOne({ where: { email: "desk@loadline.test" } });
    expect(desk!.roles).toContain("moderator");
  });

  it("holds the doctored sheets for the review desk and marks only clean sheets bench-verified", async () => {
    const held = await Listing.findAll({ where: { serialNumber: serials, status: "held" } });
    // Output voltage giving far less than the typed power; 4 Ω power three times 8 Ω; peak swing
    // beyond the rails; THD+N below THD.
    expect(held.map((l) => l.model).sort()).toEqual(["Velt C20", "WQ 45r", "ZK 15.2", "ZK 5.0"]);
    for (const l of held) {
      expect(l.benchVerified).toBe(false);
      expect(l.heldReason).toMatch(/implausible/i);
    }
    const verified = await Listing.findAll({
      where: { serialNumber: serials, benchVerified: true },
      include: [{ model: BenchSheet, as: "benchSheet" }],
    });
    expect(verified.length).toBeGreaterThan(15);
    for (const l of verified) {
      expect(l.benchSheet?.verdict?.benchVerified).toBe(true);
    }
    // Only listings with a sheet can carry the mark.
    expect(
      await Listing.count({ where: { serialNumber: DEMO_UNITS.filter((u) => !u.sheet).map((u) => u.serial), benchVerified: true } }),
    ).toBe(0);
  });

  it("copies measured figures into the filter columns (power into 8 Ω, the weaker channel)", async () => {
    const amp = await Listing.findOne({ where: { serialNumber: "CW-46I-017924" } });
    expect(amp!.power8ohmW).toBe(65); // left 66 W, right 65 W
    expect(amp!.power4ohmW).toBe(96);
    const deck = await Listing.findOne({ where: { serialNumber: "QV-T3-118070" } });
    expect(deck!.wowFlutterPct).toBeCloseTo(0.05, 6);
    expect(deck!.power8ohmW).toBeNull();
  });

  it("stores every photo size in object storage, and one cover per listing", async () => {
    const photos = await ListingPhoto.findAll({
      where: { listingId: { [Op.in]: (await Listing.findAll({ where: { serialNumber: serials }, attributes: ["id"] })).map((l) => l.id) } },
    });
    const sample = photos.slice(0, 6);
    for (const p of sample) {
      for (const key of [p.originalKey, p.thumbKey!, p.listingKey!, p.zoomKey!]) {
        expect(await headObject(key), key).not.toBeNull();
      }
    }
    expect(photos.every((p) => p.status === "ready" && /^[0-9a-f]{16}$/.test(p.phash!))).toBe(true);
    const covers = photos.filter((p) => p.isCover).map((p) => p.listingId);
    expect(new Set(covers).size).toBe(covers.length);
  });
});
