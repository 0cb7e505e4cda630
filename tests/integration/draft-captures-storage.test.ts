import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, ListingPhoto } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { createDraft } from "~/listings/drafts.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { postCaptureForm } from "~/listings/capture-post.server";
import { cleanDraftStorage, deleteDraft } from "~/listings/delete-draft.server";
import { ListingInputError } from "~/listings/errors.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { processPhoto } from "~/photos/process.server";
import { action as analyze } from "~/routes/api.v1.captures.analyze";
import { ensureBucket } from "~/services/storage.server";
import { QUEUES } from "~/services/jobs.server";
import { toneWav } from "../support/capture-files";
import { routeArgs } from "../support/route-args";
import { plainPng } from "../support/photo-files";
import { bucketKeys } from "../support/bucket-keys";
import { BASE, cleanUp, makeAccount, withOwnCaptures, type Seller } from "./listing-support";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { removePhoto, upload as uploadPhoto } from "./photos-support";

// A draft's stored objects against the storage stand-in (s3rver): a capture taken off the sheet leaves
// no file behind, and deleting the draft leaves nothing of it in the bucket, whatever it once had.
beforeAll(ensureBucket);
afterAll(cleanUp);

/** Runs every queued clean-up job naming one of these keys, as the worker would (twice: a retry is harmless). */
async function runCleanJobs(keys: string[]): Promise<number> {
  const jobs = await sequelize.query<{ data: unknown }>(
    `SELECT data FROM pgboss.job WHERE name = $1 AND EXISTS (SELECT 1 FROM jsonb_array_elements_text(data->'keys') k WHERE k = ANY($2::text[]))`,
    { bind: [QUEUES.draftStorageClean, keys], type: QueryTypes.SELECT },
  );
  for (const j of jobs) for (let i = 0; i < 2; i++) await cleanDraftStorage(j.data);
  return jobs.length;
}

const SINE = {
  kind: "sine",
  scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 10 },
  loadOhm: 8,
  fundamentalHz: 1000,
};
const wav = () => toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, harmonics: [1, 0.001], peak: 0.5, bits: "16", channels: 2 });

function captureForm(name: string): FormData {
  const form = new FormData();
  form.append("conditions", JSON.stringify(SINE));
  form.append("file", new Blob([new Uint8Array(wav())], { type: "audio/wav" }), name);
  return form;
}

/** A capture uploaded through the API from the bench step (`?listing=`), then analysed by the job. */
async function uploadCapture(seller: Seller, listingId: string | null, name: string): Promise<Capture> {
  const query = listingId ? `&listing=${listingId}` : "";
  const req = new Request(`${BASE}/api/v1/captures/analyze?wait=0${query}`, {
    method: "POST",
    body: captureForm(name),
    headers: { Cookie: seller.cookie, Origin: BASE },
  });
  const res = await analyze(routeArgs(req, {}));
  expect(res.status).toBe(202);
  const { id } = (await res.json()) as { id: string };
  await analyseCaptureJob({ captureId: id });
  const c = (await Capture.findByPk(id))!;
  expect(c.status).toBe("done");
  return c;
}

/** The sheet the bench step saves when this capture's figures are its only ones. */
const sheetOf = (c: Capture | null) => ({ category: "integrated_amplifier", readings: c?.readings ?? [], sweeps: [] });

describe("a draft's capture files", () => {
  it("go when taken off the sheet or replaced, and with the draft: nothing of the draft is left in the bucket", async () => {
    const seller = await makeAccount("capture-files");
    const draft = await createDraft(seller.session, "integrated_amplifier");

    // First capture on the sheet, then replaced by a second: the first's row and file go.
    const first = await uploadCapture(seller, draft.id, "first.wav");
    expect(first.listingId).toBe(draft.id);
    await saveBenchSheet(draft.id, seller.user.id, sheetOf(first));
    const second = await uploadCapture(seller, draft.id, "second.wav");
    await saveBenchSheet(draft.id, seller.user.id, sheetOf(second));
    expect(await Capture.findByPk(first.id)).toBeNull();
    expect(await runCleanJobs([first.storageKey!])).toBe(1);
    expect((await bucketKeys()).has(first.storageKey!)).toBe(false);
    expect((await bucketKeys()).has(second.storageKey!)).toBe(true);

    // Taken off the sheet altogether: the same.
    await saveBenchSheet(draft.id, seller.user.id, sheetOf(null));
    expect(await Capture.findByPk(second.id)).toBeNull();
    await runCleanJobs([second.storageKey!]);
    expect((await bucketKeys()).has(second.storageKey!)).toBe(false);

    // One uploaded for the draft that never reached the sheet, one uploaded without naming the draft and
    // put on its sheet (tied to it then), and one through the plain form while the job runs.
    const unused = await uploadCapture(seller, draft.id, "unused.wav");
    const untied = await uploadCapture(seller, null, "untied.wav");
    expect(untied.listingId).toBeNull();
    await saveBenchSheet(draft.id, seller.user.id, sheetOf(untied));
    expect((await Capture.findByPk(untied.id))?.listingId).toBe(draft.id);
    const posting = postCaptureForm(
      new Request(`${BASE}/sell/${draft.id}/bench`, {
        method: "POST",
        body: captureForm("posted.wav"),
        headers: { Cookie: seller.cookie },
      }),
      draft.id,
      seller.user.id,
    );
    let posted: Capture | null = null;
    for (let i = 0; i < 100 && !posted; i++) {
      posted = await Capture.findOne({ where: { ownerId: seller.user.id, fileName: "posted.wav" } });
      if (!posted) await new Promise((r) => setTimeout(r, 50));
    }
    // Tied by the upload itself, before its figures reach the sheet.
    expect(posted?.listingId).toBe(draft.id);
    await analyseCaptureJob({ captureId: posted!.id });
    await posting;
    expect((await Capture.findByPk(posted!.id))?.listingId).toBe(draft.id);

    // A photo replaced: the first deleted (its sizes go at once), another uploaded and processed.
    const photoId = async (res: Response) => ((await res.json()) as { photo: { id: string } }).photo.id;
    const oldPhoto = await photoId(await uploadPhoto(draft.id, await plainPng(640, 480), "old.png", seller.cookie));
    expect(await processPhoto({ photoId: oldPhoto })).toBe("ready");
    const old = (await ListingPhoto.findByPk(oldPhoto))!;
    const oldKeys = [old.originalKey, old.thumbKey!, old.listingKey!, old.zoomKey!, `incoming/${oldPhoto}`];
    expect((await removePhoto(draft.id, oldPhoto, seller.cookie)).status).toBe(200);
    const newPhoto = await photoId(await uploadPhoto(draft.id, await plainPng(640, 480), "new.png", seller.cookie));
    expect(await processPhoto({ photoId: newPhoto })).toBe("ready");
    const fresh = (await ListingPhoto.findByPk(newPhoto))!;
    const freshKeys = [fresh.originalKey, fresh.thumbKey!, fresh.listingKey!, fresh.zoomKey!];
    const mid = await bucketKeys();
    expect(oldKeys.filter((k) => mid.has(k))).toEqual([]);

    const all = [first, second, unused, untied, posted!].map((c) => c.storageKey!);
    const before = await bucketKeys();
    expect([unused, untied, posted!].map((c) => before.has(c.storageKey!))).toEqual([true, true, true]);

    const { keys } = await deleteDraft(draft.id, seller.user.id);
    expect(keys).toEqual(expect.arrayContaining([unused.storageKey, untied.storageKey, posted!.storageKey, ...freshKeys]));
    expect(await Capture.count({ where: { id: [unused.id, untied.id, posted!.id] } })).toBe(0);
    expect(await BenchSheet.count({ where: { listingId: draft.id } })).toBe(0);
    await runCleanJobs(keys);
    const after = await bucketKeys();
    expect([...all, ...oldKeys, ...freshKeys].filter((k) => after.has(k))).toEqual([]);
  });

  it("keeps a capture taken off one sheet while another listing's sheet still names it", async () => {
    const seller = await makeAccount("capture-shared");
    const one = await createDraft(seller.session, "integrated_amplifier");
    const two = await createDraft(seller.session, "integrated_amplifier");
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    const typedOnly = { ...sheet, readings: sheet.readings.filter((r) => r.origin !== "capture") };
    const ids = [...new Set(sheet.readings.flatMap((r) => (r.captureId ? [r.captureId] : [])))];
    expect(ids.length).toBeGreaterThan(0);
    await saveBenchSheet(one.id, seller.user.id, sheet);
    await saveBenchSheet(two.id, seller.user.id, sheet);
    await saveBenchSheet(one.id, seller.user.id, typedOnly);
    expect(await Capture.count({ where: { id: ids } })).toBe(ids.length);
    // Off the last sheet too: now they go, their files queued for the clean-up job.
    await saveBenchSheet(two.id, seller.user.id, typedOnly);
    expect(await Capture.count({ where: { id: ids } })).toBe(0);
  });

  it("never removes a capture that a save elsewhere is putting on its sheet at the same moment", async () => {
    const seller = await makeAccount("capture-race");
    const one = await createDraft(seller.session, "integrated_amplifier");
    const two = await createDraft(seller.session, "integrated_amplifier");
    const settled = (p: Promise<unknown>) =>
      p.then(
        () => "saved" as const,
        (e: unknown) => e,
      );
    const pause = () => new Promise((r) => setTimeout(r, 300));
    const idsOf = (sheet: { readings: { captureId?: string }[] }) => [
      ...new Set(sheet.readings.flatMap((r) => (r.captureId ? [r.captureId] : []))),
    ];

    // Taken off the first sheet (not committed yet) while the second takes it up: the second save is refused.
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    const typedOnly = { ...sheet, readings: sheet.readings.filter((r) => r.origin !== "capture") };
    await saveBenchSheet(one.id, seller.user.id, sheet);
    const t1 = await sequelize.transaction();
    await saveBenchSheet(one.id, seller.user.id, typedOnly, { transaction: t1 });
    const adding = settled(saveBenchSheet(two.id, seller.user.id, sheet));
    await pause();
    await t1.commit();
    expect(await adding).toBeInstanceOf(ListingInputError);
    expect(await BenchSheet.count({ where: { listingId: two.id } })).toBe(0);
    expect(await Capture.count({ where: { id: idsOf(sheet) } })).toBe(0);

    // Taken up by the second sheet (not committed yet) while the first lets go of it: it stays.
    const again = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    await saveBenchSheet(one.id, seller.user.id, again);
    const t2 = await sequelize.transaction();
    await saveBenchSheet(two.id, seller.user.id, again, { transaction: t2 });
    const dropping = settled(saveBenchSheet(one.id, seller.user.id, typedOnly));
    await pause();
    await t2.commit();
    expect(await dropping).toBe("saved");
    expect(await Capture.count({ where: { id: idsOf(again) } })).toBe(idsOf(again).length);
  });
});
