import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it, vi } from "vitest";

// The sold-price index from orders walked through the real steps: median, range and count, split by
// the bench-verified mark, shown from three sales; sales with a part refund left out; maker and model
// matched whatever their case and spacing; sales in another currency converted with the admin's rates.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { soldPriceIndex } = await import("~/reputation/price-index.server");
const { currentRates } = await import("~/currencies/rates.server");
const { convertMinor } = await import("@shared/currency");
const { sale } = await import("./reputation-support");

afterAll(() => sequelize.close());

const model = () => `Index ${randomBytes(3).toString("hex")}`;

describe("the sold-price index", () => {
  it("needs three completed sales before it says anything", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 50_000);
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toBeNull();
    await sale("Brannock Audio", m, 60_000);
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toMatchObject({
      currency: "EUR",
      all: { count: 3, medianMinor: 50_000, lowMinor: 40_000, highMinor: 60_000 },
    });
  });

  it("splits by the bench-verified mark, an even count's median being the mean of the middle two", async () => {
    const m = model();
    await sale("Brannock Audio", m, 70_000, { verified: true });
    await sale("Brannock Audio", m, 80_000, { verified: true });
    await sale("Brannock Audio", m, 45_000);
    await sale("Brannock Audio", m, 30_000);
    expect(await soldPriceIndex("brannock  audio", ` ${m.toUpperCase()} `, "EUR")).toEqual({
      currency: "EUR",
      all: { count: 4, medianMinor: 57_500, lowMinor: 30_000, highMinor: 80_000 },
      verified: { count: 2, medianMinor: 75_000, lowMinor: 70_000, highMinor: 80_000 },
      unverified: { count: 2, medianMinor: 37_500, lowMinor: 30_000, highMinor: 45_000 },
    });
  });

  it("leaves out a sale settled with a part refund, and a sale still in its audition window", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 42_000);
    await sale("Brannock Audio", m, 44_000, { refund: 10_000 });
    await sale("Brannock Audio", m, 48_000, { stopInAudition: true });
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toBeNull();
    await sale("Brannock Audio", m, 46_000);
    expect((await soldPriceIndex("Brannock Audio", m, "EUR"))?.all).toEqual({
      count: 3,
      medianMinor: 42_000,
      lowMinor: 40_000,
      highMinor: 46_000,
    });
  });

  it("converts sales made in another currency with the admin's rates", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 50_000);
    await sale("Brannock Audio", m, 30_000, { currency: "GBP" });
    const gbpInEur = convertMinor(30_000, "GBP", "EUR", await currentRates())!;
    expect(gbpInEur).toBeGreaterThan(30_000);
    const index = await soldPriceIndex("Brannock Audio", m, "EUR");
    const sorted = [40_000, 50_000, gbpInEur].sort((a, b) => a - b);
    expect(index?.all).toEqual({ count: 3, medianMinor: sorted[1], lowMinor: sorted[0], highMinor: sorted[2] });
  });
});
