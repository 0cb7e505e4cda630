import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { account, cleanUp, liveAmplifier, queued, recipients, runJobs, type SentMail } from "./alerts-support";
import { blankListing } from "../support/blank-listing";
import { createAmplifierListing, removeFixtureUsers } from "../support/listing-fixtures";

// Matching on publish: publishing queues the match job in its transaction; the job records which
// alerts a new listing matches (checked here against a hand-written expectation), mails the "at once"
// ones, keeps the daily ones for the digest, and never alerts a seller to their own unit or sends a
// listing twice for one alert.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { Listing, User } = await import("~/models/index.server");
const { SpecAlert } = await import("~/models/spec-alert.server");
const { matchSpecAlerts } = await import("~/alerts/matching.server");
const { publishListing } = await import("~/listings/publish.server");
const { withdrawListing } = await import("~/listings/drafts.server");
const { QUEUES } = await import("~/services/jobs.server");
const { normaliseRoles } = await import("~/auth/roles");

type Account = Awaited<ReturnType<typeof account>>;
let seller: Account;
let xena: Account;
let yann: Account;
const alerts: Record<string, InstanceType<typeof SpecAlert>> = {};
let units: Record<"A" | "B" | "C", InstanceType<typeof Listing>>;

async function hits(listingId: string): Promise<string[]> {
  const [rows] = await sequelize.query(`SELECT alert_id FROM spec_alert_hits WHERE listing_id = :listingId`, {
    replacements: { listingId },
  });
  const names = new Map(Object.entries(alerts).map(([name, a]) => [a.id, name]));
  return (rows as { alert_id: string }[]).flatMap((r) => (names.has(r.alert_id) ? [names.get(r.alert_id)!] : [])).sort();
}

beforeAll(async () => {
  seller = await account("match-seller", ["buyer", "seller"]);
  xena = await account("match-xena");
  yann = await account("match-yann");
  // Three units, as the facet columns hold them after the bench's check.
  const A = await liveAmplifier(seller.id, { priceMinor: 120_000, mainsVoltageV: 230, benchVerified: true, power8ohmW: 110, thdPct: 0.03 });
  const B = await liveAmplifier(seller.id, { priceMinor: 90_000, currency: "GBP", benchVerified: false, power8ohmW: 85, thdPct: 0.08 });
  const C = await Listing.create(
    blankListing(seller.id, "turntable", {
      status: "live",
      maker: "Orrin Platterworks",
      model: "OP-3",
      priceMinor: 40_000,
      currency: "EUR",
      country: "DE",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: new Date(),
      benchVerified: true,
      wowFlutterPct: 0.05,
    }),
  );
  units = { A, B, C };
  const alert = (name: string, user: Account, query: string, frequency: "instant" | "daily" | "off" = "instant") =>
    SpecAlert.create({ userId: user.id, name, query, frequency }).then((a) => (alerts[name] = a));
  await alert("strong and clean", xena, "category=integrated-amplifiers&power8Min=100+W&thdMax=0.05+%25");
  await alert("80 W verified", xena, "power8Min=80+W", "daily");
  await alert("80 W measured", yann, "power8Min=80+W&figures=measured");
  await alert("turntables", yann, "category=turntables", "daily");
  await alert("under 500 euros", yann, "priceMax=500");
  await alert("230 V", xena, "mains=230");
  await alert("anything", xena, "");
  await alert("platterworks text", yann, "q=platterworks");
  await alert("showroom only", yann, "condition=showroom");
  await alert("switched off", yann, "", "off");
  await alert("sellers own", seller, "");
  await runJobs(QUEUES.alertMatch, () => Promise.resolve()); // jobs other suites left
});
beforeEach(() => {
  sent.length = 0;
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

describe("matching a new listing against the spec alerts", () => {
  it("finds exactly the alerts written down for each unit; never the seller's own, never one switched off", async () => {
    for (const unit of Object.values(units)) await matchSpecAlerts({ listingId: unit.id });
    expect(await hits(units.A.id)).toEqual(["230 V", "80 W measured", "80 W verified", "anything", "strong and clean"]);
    // B's figures are on a sheet that is not bench-verified: only the alert that takes measured figures counts them.
    expect(await hits(units.B.id)).toEqual(["80 W measured", "anything"]);
    expect(await hits(units.C.id)).toEqual(["anything", "platterworks text", "turntables", "under 500 euros"]);
  });

  it("mails the at-once alerts, one mail per alert and unit, and keeps the daily ones for the digest", async () => {
    const unit = await liveAmplifier(seller.id, { benchVerified: true, power8ohmW: 120, thdPct: 0.02, priceMinor: 45_000 });
    expect(await matchSpecAlerts({ listingId: unit.id })).toEqual({ matched: 5, mailed: 4 });
    expect(recipients(sent)).toEqual([xena.email, xena.email, yann.email, yann.email].sort());
    const mail = sent.find((m) => m.subject.includes("strong and clean"))!;
    expect(mail.subject).toBe(`New for your alert “strong and clean”: Fenwold Acoustics ${unit.model}`);
    expect(mail.text).toContain(`/listings/${unit.id}`);
    expect(mail.text).toContain("/market?category=integrated-amplifiers&power8Min=100+W&thdMax=0.05+%25");
    expect(mail.headers?.["List-Unsubscribe"]).toMatch(/\/unsubscribe\/[A-Za-z0-9_-]{43}>$/);
    const [rows] = await sequelize.query(`SELECT alert_id, mailed_at FROM spec_alert_hits WHERE listing_id = :id`, {
      replacements: { id: unit.id },
    });
    const waiting = (rows as { alert_id: string; mailed_at: Date | null }[]).filter((r) => r.mailed_at === null).map((r) => r.alert_id);
    expect(waiting).toEqual([alerts["80 W verified"].id]);

    // The job again (a retry), or the unit withdrawn and published again: nothing new is sent.
    sent.length = 0;
    expect(await matchSpecAlerts({ listingId: unit.id })).toEqual({ matched: 0, mailed: 0 });
    expect(sent).toEqual([]);
  });

  it("matches nothing for a unit that is no longer live when the job runs", async () => {
    const unit = await liveAmplifier(seller.id, { status: "withdrawn" });
    expect(await matchSpecAlerts({ listingId: unit.id })).toEqual({ matched: 0, mailed: 0 });
    expect(await hits(unit.id)).toEqual([]);
  });
});

describe("publishing", () => {
  it("queues the match job in the publish transaction when the unit goes live, and the job mails the buyer", async () => {
    const { listing, seller: workshop } = await createAmplifierListing({ status: "draft", label: "alert-publish" });
    try {
      const session = {
        id: workshop.id,
        email: workshop.email,
        displayName: workshop.displayName,
        roles: normaliseRoles(workshop.roles),
        emailVerified: true,
      };
      expect(await queued(QUEUES.alertMatch, [listing.id])).toEqual([]);
      const { listing: published } = await publishListing(listing.id, session);
      expect(published.status).toBe("live");
      expect(await queued(QUEUES.alertMatch, [listing.id])).toEqual([{ listingId: listing.id }]);
      await runJobs(QUEUES.alertMatch, (data) => matchSpecAlerts(data));
      expect(sent.filter((m) => m.text.includes(`/listings/${listing.id}`)).map((m) => m.subject)).toContain(
        "New for your alert “anything”: Tallowmere Audio Ostry 60",
      );

      // Withdrawn and published again: queued again, and no alert hears of it twice.
      await withdrawListing(listing.id, workshop.id);
      sent.length = 0;
      await publishListing(listing.id, session);
      await runJobs(QUEUES.alertMatch, (data) => matchSpecAlerts(data));
      expect(sent.filter((m) => m.text.includes(`/listings/${listing.id}`) && m.subject.includes("“anything”"))).toEqual([]);
    } finally {
      await removeFixtureUsers([await User.findByPk(workshop.id).then((u) => u!)]);
    }
  });
});
