import { afterAll, describe, expect, it } from "vitest";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { Listing } from "~/models/index.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { publishListing } from "~/listings/publish.server";
import { certificateForListing, confirmUrl } from "~/certificates/certificate.server";
import { certificateStatus } from "~/certificates/status.server";
import { certificatePdf } from "~/certificates/pdf/document.server";
import { cleanUp, makeAccount, readyDraft, withOwnCaptures } from "./listing-support";
import { pdfPages, pdfQrCode } from "../support/pdf";

// The bench certificate on real PostgreSQL: issued once per sheet version, its PDF read back as text
// and its QR code decoded, its status before and after the sheet changes. The sheet is the bench
// core's invented demo amplifier; the figures expected are its readings as written in
// shared/bench/examples.ts (66 W left and 65 W right into 8 Ω, 98 dB(A), THD 0.00012 = 0.012 %).

afterAll(cleanUp);

async function liveVerified(label: string) {
  const seller = await makeAccount(label, ["workshop"]);
  const draft = await readyDraft(seller);
  await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
  await publishListing(draft.id, seller.session);
  // Back-dated: the browser suite opens demo units from the market's newest-first first page.
  await Listing.update({ publishedAt: new Date(Date.UTC(2020, 0, 1)) }, { where: { id: draft.id } });
  return { seller, listingId: draft.id };
}

describe("bench certificates", () => {
  it("prints the unit, its figures with their conditions and a QR code to its page", async () => {
    const { listingId } = await liveVerified("cert-pdf");
    const data = (await certificateForListing(listingId, null))!;
    expect(data).not.toBeNull();
    const pdf = await certificatePdf(data);
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const text = (await pdfPages(pdf)).join("\n");
    expect(text).toContain("Harrowgate Sound 120-HG");
    expect(text).toContain("Measured by Kestrel Lane Workshop");
    expect(text).toContain("Measured on 14 Mar 2025");
    expect(text).toMatch(/Output power \(left\) 66 W into 8 Ω, 1 kHz, 0\.1 % THD/);
    expect(text).toMatch(/Output power \(right\) 65 W into 8 Ω/);
    expect(text).toMatch(/THD \(left\) 0\.012 % into 8 Ω, 1 kHz, at 60 W/);
    expect(text).toMatch(/Signal-to-noise ratio \(both channels\) 98 dB\(A\) into 8 Ω, at 60 W, A-weighted/);
    expect(text).toContain("Consistent Power into half the load is at most double");
    expect(text).toContain(data.id);
    expect(await pdfQrCode(pdf)).toBe(confirmUrl(data.id));
    expect(confirmUrl(data.id)).toMatch(new RegExp(`/certificates/${data.id}$`));
  });

  it("gives one certificate per sheet version and says when the sheet changed after it", async () => {
    const { seller, listingId } = await liveVerified("cert-status");
    const first = (await certificateForListing(listingId, null))!;
    expect((await certificateForListing(listingId, seller.session))!.id).toBe(first.id);
    expect(await certificateStatus(first.id)).toMatchObject({ state: "matches", supersededAt: null, listing: { id: listingId } });

    const before = Date.now();
    const changed = { ...exampleIntegratedAmplifierSheet(), notes: "Bias re-set after a week's use." };
    await saveBenchSheet(listingId, seller.user.id, await withOwnCaptures(changed, seller.user.id));
    const old = (await certificateStatus(first.id))!;
    expect(old.state).toBe("superseded");
    expect(Date.parse(old.supersededAt!)).toBeGreaterThanOrEqual(before - 1000);

    const second = (await certificateForListing(listingId, null))!;
    expect(second.id).not.toBe(first.id);
    expect((await certificateStatus(second.id))!.state).toBe("matches");
  });

  it("gives none for a unit that is not bench-verified or that the viewer may not see", async () => {
    const seller = await makeAccount("cert-draft", ["workshop"]);
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
    // A draft carries no mark, even with a sheet that would earn it.
    expect(await certificateForListing(draft.id, seller.session)).toBeNull();
    const { listingId } = await liveVerified("cert-withdrawn");
    await Listing.update({ status: "withdrawn" }, { where: { id: listingId } });
    expect(await certificateForListing(listingId, null)).toBeNull();
    expect(await certificateForListing("not-an-id", null)).toBeNull();
    expect(await certificateStatus("00000000-0000-4000-8000-000000000000")).toBeNull();
  });
});
