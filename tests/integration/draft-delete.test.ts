import { afterAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { createDraft, saveItem } from "~/listings/drafts.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { addRestorationEntry } from "~/listings/restoration.server";
import { cleanDraftStorage, deleteDraft } from "~/listings/delete-draft.server";
import { ListingNotFound, ListingStateError } from "~/listings/errors.server";
import { processPhoto } from "~/photos/process.server";
import { putObject } from "~/services/storage.server";
import { QUEUES } from "~/services/jobs.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { readItemForm } from "@shared/listing-draft";
import { plainPng } from "../support/photo-files";
import { bucketKeys } from "../support/bucket-keys";
import { AMP_ITEM, cleanUp, makeAccount, makeWorkshopAccount, readyDraft, withOwnCaptures } from "./listing-support";
import { upload } from "./photos-support";

afterAll(cleanUp);

async function cleanJobsFor(key: string): Promise<{ data: unknown }[]> {
  return sequelize.query<{ data: unknown }>(`SELECT data FROM pgboss.job WHERE name = $1 AND data->'keys' @> to_jsonb(ARRAY[$2::text])`, {
    bind: [QUEUES.draftStorageClean, key],
    type: QueryTypes.SELECT,
  });
}

describe("deleting a draft", () => {
  it("removes the draft with its photos in every size, its log, sheet and captures, and leaves nothing in storage", async () => {
    const seller = await makeAccount("deletes-draft");
    const draft = await createDraft(seller.session, "integrated_amplifier");
    await saveItem(draft.id, seller.user.id, AMP_ITEM);
    await addRestorationEntry(draft.id, seller.user.id, {
      doneOn: "2026-11-02",
      work: "Recapped the power supply.",
      technician: null,
      parts: [],
      readingsBefore: [],
      readingsAfter: [],
    });
    const res = await upload(draft.id, await plainPng(640, 480), "front.png", seller.cookie);
    expect(res.ok).toBe(true);
    const { photo } = (await res.json()) as { photo: { id: string } };
    expect(await processPhoto({ photoId: photo.id })).toBe("ready");
    // A second photo still waiting for its job: its upload sits under incoming/.
    const waiting = (await (await upload(draft.id, await plainPng(320, 240), "back.png", seller.cookie)).json()) as {
      photo: { id: string };
    };
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    await saveBenchSheet(draft.id, seller.user.id, sheet);
    const captures = await Capture.findAll({ where: { ownerId: seller.user.id } });
    expect(captures.length).toBeGreaterThan(0);
    for (const c of captures) await putObject(c.storageKey!, "frequency,level\n1000,0\n", { contentType: "text/csv" });

    const stored = await ListingPhoto.findByPk(photo.id);
    const photoObjects = [stored!.originalKey, stored!.thumbKey!, stored!.listingKey!, stored!.zoomKey!, `incoming/${waiting.photo.id}`];
    const captureObjects = captures.map((c) => c.storageKey!);
    const before = await bucketKeys();
    for (const key of [...photoObjects, ...captureObjects]) expect(before.has(key), key).toBe(true);

    // Another draft of the same seller, untouched by the deletion.
    const other = await readyDraft(seller);
    const otherPhotos = await ListingPhoto.findAll({ where: { listingId: other.id } });

    const { keys } = await deleteDraft(draft.id, seller.user.id);
    // Every object the draft has in storage is queued (also keys reserved for a photo still waiting).
    expect(keys).toEqual(expect.arrayContaining([...photoObjects, ...captureObjects]));
    expect(await Listing.findByPk(draft.id)).toBeNull();
    expect(await ListingPhoto.count({ where: { listingId: draft.id } })).toBe(0);
    expect(await RestorationEntry.count({ where: { listingId: draft.id } })).toBe(0);
    expect(await BenchSheet.count({ where: { listingId: draft.id } })).toBe(0);
    expect(await Capture.count({ where: { id: captures.map((c) => c.id) } })).toBe(0);

    // The job queued with the deletion clears storage; running it twice is harmless.
    const jobs = await cleanJobsFor(photoObjects[0]);
    expect(jobs).toHaveLength(1);
    await cleanDraftStorage(jobs[0].data);
    await cleanDraftStorage(jobs[0].data);
    const after = await bucketKeys();
    const left = [...photoObjects, ...captureObjects].filter((k) => after.has(k));
    expect(left).toEqual([]);
    expect(await Listing.findByPk(other.id)).not.toBeNull();
    expect(await ListingPhoto.count({ where: { listingId: other.id } })).toBe(otherPhotos.length);
  });

  it("keeps a capture another listing's sheet still uses", async () => {
    const seller = await makeAccount("shared-capture");
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    const first = await createDraft(seller.session, "integrated_amplifier");
    const second = await createDraft(seller.session, "integrated_amplifier");
    await saveBenchSheet(first.id, seller.user.id, sheet);
    await saveBenchSheet(second.id, seller.user.id, sheet);
    const { keys } = await deleteDraft(first.id, seller.user.id);
    expect(keys).toEqual([]);
    expect(await Capture.count({ where: { ownerId: seller.user.id } })).toBeGreaterThan(0);
  });

  it("is for drafts only, and only their seller's", async () => {
    const seller = await makeAccount("not-a-draft");
    const stranger = await makeAccount("stranger");
    const draft = await readyDraft(seller);
    await expect(deleteDraft(draft.id, stranger.user.id)).rejects.toBeInstanceOf(ListingNotFound);
    await draft.update({ status: "live", publishedAt: new Date("2020-01-01T00:00:00Z") });
    await expect(deleteDraft(draft.id, seller.user.id)).rejects.toBeInstanceOf(ListingStateError);
    // Sent back by the desk: a draft again, but it was published once and keeps its record.
    await draft.update({ status: "draft" });
    await expect(deleteDraft(draft.id, seller.user.id)).rejects.toBeInstanceOf(ListingStateError);
    expect(await Listing.findByPk(draft.id)).not.toBeNull();
  });
});

describe("a draft's currency", () => {
  it("starts in the currency of the workshop's country", async () => {
    const shop = await makeWorkshopAccount("uk-shop", { name: "Fenwold Bench", country: "GB", region: "Marrowshire", town: "Fenwold" });
    const draft = await createDraft(shop.session, "integrated_amplifier");
    expect([draft.country, draft.currency]).toEqual(["GB", "GBP"]);
  });

  it("follows the country a plain form saves, unless the seller chose a currency", async () => {
    const seller = await makeAccount("moves-country");
    const draft = await createDraft(seller.session, "integrated_amplifier");
    expect(draft.currency).toBe("EUR");
    const save = async (fields: Record<string, string>) => {
      const read = readItemForm(new URLSearchParams({ category: "integrated_amplifier", ...fields }));
      if (!read.ok) throw new Error(JSON.stringify(read.errors));
      await saveItem(draft.id, seller.user.id, read.value);
      return (await Listing.findByPk(draft.id))!.currency;
    };
    // The form posts the currency it showed (EUR) with the newly picked country.
    expect(await save({ country: "GB", currency: "EUR", price: "950" })).toBe("GBP");
    expect(await save({ country: "GB", currency: "USD", price: "950" })).toBe("USD");
    expect(await save({ country: "SE", currency: "USD", price: "950" })).toBe("USD");
  });
});
