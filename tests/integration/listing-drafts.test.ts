import { afterAll, describe, expect, it } from "vitest";
import { User } from "~/models/index.server";
import { createDraft, saveCondition, saveItem } from "~/listings/drafts.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { ListingInputError } from "~/listings/errors.server";
import { publishListing } from "~/listings/publish.server";
import { addRestorationEntry, deleteRestorationEntry, restorationLog, updateRestorationEntry } from "~/listings/restoration.server";
import { readItemForm } from "@shared/listing-draft";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { AMP_ITEM, cleanUp, inputError, makeAccount, makeWorkshopAccount, readyDraft, reload, withOwnCaptures } from "./listing-support";

afterAll(cleanUp);

describe("starting a draft", () => {
  it("makes a buyer who lists a seller, in the same step", async () => {
    const buyer = await makeAccount("first-lister", ["buyer"]);
    const draft = await createDraft(buyer.session, "turntable");
    expect(draft.status).toBe("draft");
    expect(draft.category).toBe("turntable");
    expect((await User.findByPk(buyer.user.id))!.roles).toEqual(["buyer", "seller"]);
  });

  it("lists a workshop's unit under the workshop, starting from its location", async () => {
    const { workshop, ...shop } = await makeWorkshopAccount("shop", {
      name: "Test Bench Works",
      country: "NL",
      region: "Veldmark",
      town: "Ossendam",
    });
    const draft = await createDraft(shop.session, "integrated_amplifier");
    expect(draft.workshopId).toBe(workshop.id);
    expect([draft.country, draft.region, draft.town]).toEqual(["NL", "Veldmark", "Ossendam"]);
    expect((await User.findByPk(shop.user.id))!.roles).toEqual(["buyer", "workshop"]);
  });

  it("refuses an unknown kind of unit", async () => {
    const seller = await makeAccount("bad-category");
    await expect(createDraft(seller.session, "jukebox")).rejects.toBeInstanceOf(ListingInputError);
  });
});

describe("saving the item and condition steps", () => {
  it("stores what the form typed: price in minor units, era, grams, zone prices and the private serial number", async () => {
    const seller = await makeAccount("item-form");
    const draft = await createDraft(seller.session, "integrated_amplifier");
    const form = new URLSearchParams({
      category: "integrated_amplifier",
      maker: "Harrowgate Sound",
      model: "120-HG",
      era: "1975–79",
      serialNumber: "HS1207734",
      mainsVoltageV: "230",
      mainsFrequencyHz: "50",
      weight: "31,5",
      boxedLength: "62",
      boxedWidth: "55",
      boxedHeight: "30",
      price: "1.250,50",
      currency: "EUR",
      country: "DE",
      postcode: "10115",
      "freight.domestic": "120",
      "freight.nearby": "185,00",
      handlingDays: "5",
      offersWelcome: "on",
    });
    const read = readItemForm(form);
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    await saveItem(draft.id, seller.user.id, read.value);
    const { listing } = await reload(draft.id);
    expect(listing.priceMinor).toBe(125_050);
    expect([listing.yearFrom, listing.yearTo]).toEqual([1975, 1979]);
    expect(listing.weightG).toBe(31_500);
    expect([listing.boxedLengthMm, listing.boxedWidthMm, listing.boxedHeightMm]).toEqual([620, 550, 300]);
    expect(listing.shippingOptions).toEqual([{ method: "freight", prices: { domestic: 12_000, nearby: 18_500 } }]);
    expect(listing.serialNumber).toBe("HS1207734");
    expect(listing.offersWelcome).toBe(true);
    // The default scope never reads the serial number, so nothing serialises it by accident.
    const { Listing } = await import("~/models/index.server");
    expect((await Listing.findByPk(draft.id))!.toJSON()).not.toHaveProperty("serialNumber");
  });

  it("refuses bad values with their paths and saves nothing of that step", async () => {
    const seller = await makeAccount("item-bad");
    const draft = await createDraft(seller.session, "integrated_amplifier");
    await saveItem(draft.id, seller.user.id, { maker: "Harrowgate Sound" });
    const err = await inputError(saveItem(draft.id, seller.user.id, { model: "120-HG", priceMinor: -5, mainsFrequencyHz: 55 }));
    expect(err).toBeInstanceOf(ListingInputError);
    expect(err.issues.map((i) => i.path).sort()).toEqual(["mainsFrequencyHz", "priceMinor"]);
    const { listing } = await reload(draft.id);
    expect(listing.maker).toBe("Harrowgate Sound");
    expect(listing.model).toBeNull();
    const era = await inputError(saveItem(draft.id, seller.user.id, { yearFrom: 1981, yearTo: 1978 }));
    expect(era.issues[0].path).toBe("yearTo");
  });

  it("keeps what a published listing must have, and its kind of unit", async () => {
    const seller = await makeAccount("published-item", ["workshop"]);
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
    await publishListing(draft.id, seller.session);
    const cleared = await inputError(saveItem(draft.id, seller.user.id, { maker: null, priceMinor: null }));
    expect(cleared.issues.map((i) => i.path).sort()).toEqual(["maker", "priceMinor"]);
    const kind = await inputError(saveItem(draft.id, seller.user.id, { category: "turntable" }));
    expect(kind.issues[0].path).toBe("category");
    const cond = await inputError(saveCondition(draft.id, seller.user.id, { serviceState: null }));
    expect(cond.issues[0].path).toBe("serviceState");
    // A price change is fine.
    await saveItem(draft.id, seller.user.id, { priceMinor: 119_000 });
    expect((await reload(draft.id)).listing.priceMinor).toBe(119_000);
  });

  it("will not change a draft's kind of unit while its bench sheet holds readings", async () => {
    const seller = await makeAccount("category-change");
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
    const err = await inputError(saveItem(draft.id, seller.user.id, { ...AMP_ITEM, category: "power_amplifier" }));
    expect(err.issues[0].message).toMatch(/bench sheet/);
    expect((await reload(draft.id)).listing.category).toBe("integrated_amplifier");
  });
});

describe("the restoration log", () => {
  it("adds, edits and deletes dated entries with parts and readings", async () => {
    const seller = await makeAccount("log");
    const draft = await createDraft(seller.session, "tape_deck");
    const entry = await addRestorationEntry(draft.id, seller.user.id, {
      doneOn: "2025-01-10",
      work: "New pinch roller and belts; heads demagnetised.",
      parts: [
        { part: "Pinch roller", quantity: 1 },
        { part: "Capstan belt", quantity: 2, reference: "B1, B2" },
      ],
      technician: "",
      readingsBefore: [],
      readingsAfter: [{ quantity: "Wow & flutter", value: 0.06, unit: "% WRMS", conditions: "3150 Hz test tape" }],
    });
    expect(entry.technician).toBeNull();
    await updateRestorationEntry(draft.id, seller.user.id, entry.id, {
      doneOn: "2025-01-11",
      work: "Pinch roller and belts.",
      parts: [],
      technician: "Bench 1",
      readingsBefore: [],
      readingsAfter: [],
    });
    const log = await restorationLog(draft.id);
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({ doneOn: "2025-01-11", technician: "Bench 1", parts: [] });
    const future = await inputError(
      addRestorationEntry(draft.id, seller.user.id, {
        doneOn: "2999-01-01",
        work: "x",
        parts: [],
        technician: null,
        readingsBefore: [],
        readingsAfter: [],
      }),
    );
    expect(future.issues[0].path).toBe("doneOn");
    await deleteRestorationEntry(draft.id, seller.user.id, entry.id);
    expect((await reload(draft.id)).entries).toBe(0);
  });
});
