import { afterAll, describe, expect, it } from "vitest";
import { Listing } from "~/models/index.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { saveItem } from "~/listings/drafts.server";
import { ListingInputError, ListingStateError } from "~/listings/errors.server";
import { publishListing } from "~/listings/publish.server";
import { withdrawListing } from "~/listings/drafts.server";
import { doctoredIntegratedAmplifierSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";
import { action as sellAction } from "~/routes/sell/index";
import { BASE, call, cleanUp, inputError, makeAccount, makeCapture, readyDraft, reload, withOwnCaptures } from "./listing-support";
import { routeArgs } from "../support/route-args";

// Save, publish, hold and the bench-verified mark on real PostgreSQL. The sheets are the bench core's
// invented demo amplifier (2 × 60 W into 8 Ω) and its doctored twin whose 4 Ω power is tripled.

afterAll(cleanUp);

async function verifiedSheet(ownerId: string) {
  return withOwnCaptures(exampleIntegratedAmplifierSheet(), ownerId);
}

describe("publishing a listing", () => {
  it("refuses while required steps are missing and leaves the draft as it was", async () => {
    const seller = await makeAccount("incomplete");
    const { createDraft } = await import("~/listings/drafts.server");
    const draft = await createDraft(seller.session, "integrated_amplifier");
    await saveItem(draft.id, seller.user.id, { maker: "Harrowgate Sound" });
    const err = await inputError(publishListing(draft.id, seller.session));
    const paths = err.issues.map((i) => i.path);
    expect(paths).toEqual(
      expect.arrayContaining(["item.title", "item.price", "item.location", "condition.grade", "condition.service", "photos.photos"]),
    );
    const { listing, sheet } = await reload(draft.id);
    expect(listing.status).toBe("draft");
    expect(listing.publishedAt).toBeNull();
    expect(sheet).toBeNull();
  });

  it("needs a confirmed e-mail address", async () => {
    const seller = await makeAccount("unconfirmed", ["seller"], { verified: false });
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await verifiedSheet(seller.user.id));
    const err = await inputError(publishListing(draft.id, seller.session));
    expect(err.issues.map((i) => i.path)).toEqual(["account.email"]);
  });

  it("goes live bench-verified with the verdict stored and the filter figures filled in", async () => {
    const seller = await makeAccount("verified", ["workshop"]);
    const draft = await readyDraft(seller);
    const saved = await saveBenchSheet(draft.id, seller.user.id, await verifiedSheet(seller.user.id));
    // A draft is checked on every save but carries no mark before it is published.
    expect(saved.verdict.benchVerified).toBe(true);
    expect((await reload(draft.id)).listing.benchVerified).toBe(false);

    const { listing: published } = await publishListing(draft.id, seller.session);
    expect(published.status).toBe("live");
    const { listing, sheet } = await reload(draft.id);
    expect(listing.status).toBe("live");
    expect(listing.benchVerified).toBe(true);
    expect(listing.publishedAt).toBeInstanceOf(Date);
    expect(listing.heldReason).toBeNull();
    const verdict = sheet!.verdict!;
    expect(verdict.benchVerified).toBe(true);
    expect(verdict.counts.implausible + verdict.counts.questionable + verdict.counts.missing).toBe(0);
    expect(sheet!.checkedAt).toBeInstanceOf(Date);
    // Conservative facets: the weaker channel's power (65 W right vs 66 W left into 8 Ω; 96 vs 98 W into 4 Ω).
    expect(listing.power8ohmW).toBe(65);
    expect(listing.power4ohmW).toBe(96);
    expect(listing.snrDb).toBe(98);
    expect(listing.f3HighHz).toBe(95_000);
    expect(listing.f3LowHz).toBe(7);
    // At rated power (60 W), worse channel: THD 0.00014 = 0.014 %, THD+N 0.00021 = 0.021 %.
    expect(listing.thdPct).toBeCloseTo(0.014, 6);
    expect(listing.thdnPct).toBeCloseTo(0.021, 6);
    expect(listing.dampingFactor).toBe(150);
  });

  it("holds a sheet whose 4 Ω power is three times its 8 Ω power for the review desk, without the mark", async () => {
    const seller = await makeAccount("doctored", ["workshop"]);
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(doctoredIntegratedAmplifierSheet(), seller.user.id));
    const { listing: published, verdict } = await publishListing(draft.id, seller.session);
    expect(published.status).toBe("held");
    expect(verdict!.counts.implausible).toBeGreaterThan(0);
    const { listing } = await reload(draft.id);
    expect(listing.status).toBe("held");
    expect(listing.benchVerified).toBe(false);
    expect(listing.heldReason).toMatch(/half the load/i);
    expect(listing.publishedAt).toBeInstanceOf(Date);
    // The market reads live listings only.
    expect(await Listing.count({ where: { id: draft.id, status: "live" } })).toBe(0);
  });

  it("refuses to publish twice, and publishes again after a withdrawal", async () => {
    const seller = await makeAccount("twice");
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await verifiedSheet(seller.user.id));
    await publishListing(draft.id, seller.session);
    await expect(publishListing(draft.id, seller.session)).rejects.toBeInstanceOf(ListingStateError);
    await withdrawListing(draft.id, seller.user.id);
    expect((await reload(draft.id)).listing.status).toBe("withdrawn");
    await publishListing(draft.id, seller.session);
    expect((await reload(draft.id)).listing.status).toBe("live");
  });
});

describe("withdrawing from the seller's list", () => {
  it("needs the confirmation, and only the owner can do it", async () => {
    const seller = await makeAccount("withdraw-page");
    const other = await makeAccount("withdraw-other");
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await verifiedSheet(seller.user.id));
    await publishListing(draft.id, seller.session);
    const post = (cookie: string, fields: Record<string, string>) =>
      call(() =>
        sellAction(
          routeArgs(
            new Request(`${BASE}/sell`, {
              method: "POST",
              headers: { Cookie: cookie, "Content-Type": "application/x-www-form-urlencoded" },
              body: new URLSearchParams(fields),
            }),
            {},
          ),
        ),
      );
    const unconfirmed = await post(seller.cookie, { intent: "withdraw", ids: draft.id });
    expect(unconfirmed.body).toMatchObject({ ok: false, confirm: true, formError: expect.stringMatching(/Confirm/) });
    const stranger = await post(other.cookie, { intent: "withdraw", ids: draft.id, confirm: "yes" });
    expect(stranger.status).toBe(404);
    expect((await reload(draft.id)).listing.status).toBe("live");
    const done = await post(seller.cookie, { intent: "withdraw", ids: draft.id, confirm: "yes" });
    expect(done.status).toBe(302);
    expect((await reload(draft.id)).listing.status).toBe("withdrawn");
  });
});

describe("changing the bench sheet of a published listing", () => {
  it("takes the mark away at once when the sheet changes, and only the re-check can give it back", async () => {
    const seller = await makeAccount("recheck", ["workshop"]);
    const draft = await readyDraft(seller);
    const good = await verifiedSheet(seller.user.id);
    await saveBenchSheet(draft.id, seller.user.id, good);
    await publishListing(draft.id, seller.session);
    expect((await reload(draft.id)).listing.benchVerified).toBe(true);

    // Saving the same sheet again is no change: the mark stays.
    const same = await saveBenchSheet(draft.id, seller.user.id, good);
    expect(same.changed).toBe(false);
    expect((await reload(draft.id)).listing.benchVerified).toBe(true);

    // Without its noise figure the sheet misses a required reading: still live, no mark.
    const noNoise = { ...good, readings: good.readings.filter((r) => r.quantity !== "snr") };
    const changed = await saveBenchSheet(draft.id, seller.user.id, noNoise);
    expect(changed.changed).toBe(true);
    expect(changed.wasVerified).toBe(true);
    expect(changed.verdict.counts.missing).toBeGreaterThan(0);
    const changedRows = await reload(draft.id);
    let { listing } = changedRows;
    expect(listing.status).toBe("live");
    expect(listing.benchVerified).toBe(false);
    expect(changedRows.sheet!.verdict!.benchVerified).toBe(false);
    expect(listing.snrDb).toBeNull();

    // Put back, re-checked on save: verified again.
    await saveBenchSheet(draft.id, seller.user.id, good);
    ({ listing } = await reload(draft.id));
    expect(listing.benchVerified).toBe(true);
    expect(listing.snrDb).toBe(98);
  });

  it("sends a live listing to the review desk when a saved change is implausible", async () => {
    const seller = await makeAccount("turns-bad", ["workshop"]);
    const draft = await readyDraft(seller);
    const good = await verifiedSheet(seller.user.id);
    await saveBenchSheet(draft.id, seller.user.id, good);
    await publishListing(draft.id, seller.session);
    const tripled = {
      ...good,
      readings: good.readings.map((r) =>
        r.quantity === "output_power" && r.basis === "measured" && r.conditions.loadOhm === 4 ? { ...r, value: r.value * 3 } : r,
      ),
    };
    await saveBenchSheet(draft.id, seller.user.id, tripled);
    const { listing } = await reload(draft.id);
    expect(listing.status).toBe("held");
    expect(listing.benchVerified).toBe(false);
    expect(listing.heldReason).toMatch(/implausible/);
  });
});

describe("figures from captures", () => {
  it("are taken from the stored analysis, not from what the browser sent", async () => {
    const seller = await makeAccount("capture-owner");
    const draft = await readyDraft(seller);
    const capture = await makeCapture(seller.user.id, [
      {
        quantity: "thd",
        value: 0.00012,
        unit: "%",
        channel: "left",
        basis: "measured",
        origin: "capture",
        conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000 },
      },
    ]);
    const sheet = exampleIntegratedAmplifierSheet();
    sheet.readings = sheet.readings.filter((r) => r.origin !== "capture");
    // The browser claims a far better figure for the same capture.
    sheet.readings.push({
      quantity: "thd",
      value: 0.0000001,
      unit: "%",
      channel: "left",
      basis: "measured",
      origin: "capture",
      captureId: capture.id,
      conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000 },
    });
    const saved = await saveBenchSheet(draft.id, seller.user.id, sheet);
    const fromCapture = saved.sheet.readings.filter((r) => r.origin === "capture");
    expect(fromCapture).toHaveLength(1);
    expect(fromCapture[0].value).toBe(0.00012);
  });

  it("cannot name another seller's capture or a made-up one", async () => {
    const owner = await makeAccount("capture-real-owner");
    const other = await makeAccount("capture-borrower");
    const draft = await readyDraft(other);
    const capture = await makeCapture(owner.user.id, [
      {
        quantity: "snr",
        value: 101,
        unit: "dB",
        channel: "left",
        basis: "measured",
        origin: "capture",
        conditions: { loadOhm: 8, weighting: "A", powerW: 60 },
      },
    ]);
    for (const captureId of [capture.id, "cap_demo_1k_left"]) {
      const sheet = exampleIntegratedAmplifierSheet();
      sheet.readings = [...sheet.readings.filter((r) => r.origin !== "capture"), { ...capture.readings![0], captureId }];
      const err = await inputError(saveBenchSheet(draft.id, other.user.id, sheet));
      expect(err).toBeInstanceOf(ListingInputError);
      expect(err.issues[0].path).toMatch(/^readings\.\d+\.captureId$/);
    }
    expect((await reload(draft.id)).sheet).toBeNull();
  });

  it("cannot pass off a typed response sweep as captured", async () => {
    const seller = await makeAccount("sweep-forger");
    const draft = await readyDraft(seller);
    const sheet = exampleIntegratedAmplifierSheet();
    sheet.readings = sheet.readings.filter((r) => r.origin !== "capture");
    sheet.sweeps = [
      {
        kind: "flat",
        origin: "capture",
        captureId: "00000000-0000-4000-8000-000000000000",
        conditions: {},
        points: [20, 1000, 20_000].map((f) => ({ frequencyHz: f, levelDb: 0 })),
      },
    ];
    const err = await inputError(saveBenchSheet(draft.id, seller.user.id, sheet));
    expect(err).toBeInstanceOf(ListingInputError);
    expect(err.issues.map((i) => i.path)).toEqual(["sweeps.0.captureId"]);
  });
});
