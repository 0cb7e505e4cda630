import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { account, cleanUp, liveAmplifier, recipients, type SentMail } from "./alerts-support";

// The daily digest, run by calling it with a clock: one mail per buyer with every hit not mailed
// yet, grouped by alert; never a hit twice; nothing for alerts switched off or hits found later.
const sent: SentMail[] = [];
let failNext = false;
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    if (failNext) {
      failNext = false;
      throw new Error("relay down");
    }
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { SpecAlert } = await import("~/models/spec-alert.server");
const { sendDigests } = await import("~/alerts/digest.server");

const DAY = 86_400_000;
let clock = new Date("2031-03-04T07:00:00Z");

async function hit(alertId: string, listingId: string, foundAt: Date, mailedAt: Date | null = null) {
  await sequelize.query(
    `INSERT INTO spec_alert_hits (alert_id, listing_id, found_at, mailed_at) VALUES (:alertId, :listingId, :foundAt, :mailedAt)`,
    {
      replacements: { alertId, listingId, foundAt, mailedAt },
    },
  );
}

let seller: Awaited<ReturnType<typeof account>>;
beforeAll(async () => {
  seller = await account("digest-seller", ["buyer", "seller"]);
  // Hits other suites left unmailed go out first, so they do not turn up here.
  await sendDigests(new Date(clock.getTime() - DAY));
});
beforeEach(() => {
  sent.length = 0;
  clock = new Date(clock.getTime() + DAY);
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

describe("the daily digest", () => {
  it("sends each buyer one mail, grouped by alert, with only the hits not mailed yet and found before the run", async () => {
    const [cleo, dev] = [await account("digest-cleo"), await account("digest-dev")];
    const [a, b, c, d] = [
      await liveAmplifier(seller.id),
      await liveAmplifier(seller.id),
      await liveAmplifier(seller.id),
      await liveAmplifier(seller.id),
    ];
    const amps = await SpecAlert.create({ userId: cleo.id, name: "Amps over 80 W", query: "category=amplifiers", frequency: "daily" });
    const quiet = await SpecAlert.create({ userId: cleo.id, name: "Quiet ones", query: "snrMin=90+dB", frequency: "daily" });
    const devs = await SpecAlert.create({ userId: dev.id, name: "Anything cheap", query: "priceMax=500", frequency: "daily" });
    const hour = 3_600_000;
    await hit(amps.id, a.id, new Date(clock.getTime() - 5 * hour));
    await hit(amps.id, b.id, new Date(clock.getTime() - 3 * hour));
    await hit(quiet.id, b.id, new Date(clock.getTime() - 2 * hour));
    await hit(quiet.id, c.id, new Date(clock.getTime() - 30 * hour), new Date(clock.getTime() - 29 * hour)); // mailed yesterday
    await hit(quiet.id, d.id, new Date(clock.getTime() + hour)); // after this run
    await hit(devs.id, c.id, new Date(clock.getTime() - hour));

    expect(await sendDigests(clock)).toEqual({ users: 2, listings: 4 });
    expect(recipients(sent)).toEqual([cleo.email, dev.email].sort());
    const cleos = sent.find((m) => m.to === cleo.email)!;
    expect(cleos.subject).toBe("Your spec alerts today: 3 new units");
    // Grouped: each alert's heading, then its units.
    const lines = cleos.text.split("\n");
    const at = (s: string) => lines.findIndex((l) => l.includes(s));
    expect(at("Amps over 80 W")).toBeGreaterThan(-1);
    expect([at(`/listings/${a.id}`), at(`/listings/${b.id}`)].every((i) => i > at("Amps over 80 W") && i < at("Quiet ones"))).toBe(true);
    expect(lines.findLastIndex((l) => l.includes(`/listings/${b.id}`))).toBeGreaterThan(at("Quiet ones"));
    expect(cleos.text).not.toContain(`/listings/${c.id}`);
    expect(cleos.text).not.toContain(`/listings/${d.id}`);
    expect(cleos.headers?.["List-Unsubscribe"]).toMatch(/\/unsubscribe\/[A-Za-z0-9_-]{43}>$/);

    // Run again the same day: nothing new. The next day: the hit found after the first run.
    sent.length = 0;
    expect(await sendDigests(clock)).toEqual({ users: 0, listings: 0 });
    expect(await sendDigests(new Date(clock.getTime() + DAY))).toEqual({ users: 1, listings: 1 });
    expect(sent[0].text).toContain(`/listings/${d.id}`);
  });

  it("leaves out alerts switched off and units no longer for sale", async () => {
    const eli = await account("digest-eli");
    const [a, b] = [await liveAmplifier(seller.id), await liveAmplifier(seller.id, { status: "sold" })];
    const off = await SpecAlert.create({ userId: eli.id, name: "Stopped", query: "", frequency: "off" });
    const on = await SpecAlert.create({ userId: eli.id, name: "Running", query: "", frequency: "daily" });
    await hit(off.id, a.id, new Date(clock.getTime() - 1000));
    await hit(on.id, b.id, new Date(clock.getTime() - 1000));
    expect(await sendDigests(clock)).toEqual({ users: 0, listings: 0 });
    expect(sent).toEqual([]);
  });

  it("gives a buyer's hits back when the mail fails, so the next run sends them", async () => {
    const fay = await account("digest-fay");
    const a = await liveAmplifier(seller.id);
    const alert = await SpecAlert.create({ userId: fay.id, name: "Retry", query: "", frequency: "daily" });
    await hit(alert.id, a.id, new Date(clock.getTime() - 1000));
    failNext = true;
    await expect(sendDigests(clock)).rejects.toThrow("relay down");
    expect(await sendDigests(clock)).toEqual({ users: 1, listings: 1 });
    expect(recipients(sent)).toEqual([fay.email]);
  });
});
