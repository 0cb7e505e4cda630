import { afterAll, describe, expect, it, vi } from "vitest";
import { sequelize } from "~/db.server";
import { BenchSheet, DeskFlag, Listing } from "~/models/index.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { ListingStateError } from "~/listings/errors.server";
import { publishListing } from "~/listings/publish.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { cleanUp, makeAccount, readyDraft, withOwnCaptures, type Seller } from "./listing-support";

// Publishing is all-or-nothing: the verdict row, the listing's state and filter figures, desk flags and
// the queued jobs are written in one transaction. The fault is injected through the module system in
// the last step of publishing (the low-price check), after every other write has been made.

const fault = vi.hoisted(() => ({ armed: false }));
vi.mock("~/reputation/low-price.server", async (importOriginal) => {
  const original = await importOriginal<typeof import("~/reputation/low-price.server")>();
  return {
    ...original,
    flagLowPrice: async (...args: Parameters<typeof original.flagLowPrice>) => {
      if (fault.armed) throw new Error("injected: the database went away after the verdict was written");
      return original.flagLowPrice(...args);
    },
  };
});

afterAll(cleanUp);

async function draftWithSheet(label: string): Promise<{ seller: Seller; id: string }> {
  const seller = await makeAccount(label, ["workshop"]);
  const draft = await readyDraft(seller);
  await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
  return { seller, id: draft.id };
}

/** Everything publishing may write for one listing, as stored. */
async function stateOf(listingId: string) {
  const listing = (await Listing.scope("withSerial").findByPk(listingId))!.toJSON();
  const sheet = (await BenchSheet.findOne({ where: { listingId } }))!.toJSON();
  const flags = await DeskFlag.count({ where: { listingId } });
  const [jobs] = await sequelize.query(`SELECT name, state FROM pgboss.job WHERE data->>'listingId' = $1 ORDER BY name`, {
    bind: [listingId],
  });
  return { listing, verdict: sheet.verdict, checkedAt: sheet.checkedAt, flags, jobs };
}

/** The market sorts newest first; a unit published here must not push the demo units off page 1. */
async function backDate(listingId: string) {
  await Listing.update({ publishedAt: new Date("2020-01-15T12:00:00Z") }, { where: { id: listingId } });
}

describe("publishing is all-or-nothing", () => {
  it("a failure after the verdict row is written leaves the listing, verdict, facets, flags and jobs as they were", async () => {
    const { seller, id } = await draftWithSheet("atomic-fault");
    const before = await stateOf(id);
    expect(before.listing.status).toBe("draft");

    fault.armed = true;
    try {
      await expect(publishListing(id, seller.session)).rejects.toThrow(/injected/);
    } finally {
      fault.armed = false;
    }

    const after = await stateOf(id);
    expect(after).toEqual(before);
    expect(after.listing.benchVerified).toBe(false);
    expect(after.listing.publishedAt).toBeNull();

    // The same listing then publishes cleanly: nothing half-done stands in its way.
    const { listing } = await publishListing(id, seller.session);
    expect(listing.status).toBe("live");
    await backDate(id);
    const done = await stateOf(id);
    expect(done.listing.benchVerified).toBe(true);
    expect(done.checkedAt).not.toEqual(before.checkedAt);
    expect(done.jobs).toHaveLength(1);
  });

  it("two publishes of one listing at once give one result: one goes live, the other is told it already is", async () => {
    const { seller, id } = await draftWithSheet("atomic-race");
    const results = await Promise.allSettled([publishListing(id, seller.session), publishListing(id, seller.session)]);
    await backDate(id);
    const ok = results.filter((r) => r.status === "fulfilled");
    const refused = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(ok).toHaveLength(1);
    expect(refused).toHaveLength(1);
    expect(refused[0].reason).toBeInstanceOf(ListingStateError);
    const state = await stateOf(id);
    expect(state.listing.status).toBe("live");
    // One alert-matching job, not two.
    expect(state.jobs).toHaveLength(1);
  });
});
