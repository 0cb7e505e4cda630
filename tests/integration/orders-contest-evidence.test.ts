import { afterAll, describe, expect, it, vi } from "vitest";

// A contest's evidence beyond words: its photo is kept only as a metadata-free copy made by the
// worker and opens only through a short-lived link signed for its viewer (the buyer or a moderator,
// never the seller, never /media); its WAV capture is analysed by the bench's job and its figures join
// the comparison with the sheet; the desk's decision needs the moderator's claim and lands on the trail.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { BenchSheet, OrderContest } = await import("~/models/index.server");
const { getObjectBuffer, headObject } = await import("~/services/storage.server");
const { submitContest } = await import("~/orders/contest.server");
const { cleanContestKey, cleanContestPhotos, CONTEST_INCOMING_PREFIX } = await import("~/orders/contest-photos.server");
const { contestPhotoLinks, contestPhotoResponse, CONTEST_PHOTO_LINK_SECONDS } = await import("~/orders/contest-photo-links.server");
const { contestCaptureFinished } = await import("~/orders/contest-captures.server");
const { analyseCaptureJob } = await import("~/bench/capture-job.server");
const { isPublicMediaKey } = await import("~/catalogue/media.server");
const { resolveContest } = await import("~/orders/transitions.server");
const { claimForViewer } = await import("~/desk/claims.server");
const { auditTrail } = await import("~/desk/audit.server");
const { exampleIntegratedAmplifierSheet } = await import("@shared/bench/examples");
const { remeasurementSchema } = await import("@shared/bench/remeasure-schema");
const { testClock } = await import("../support/clock");
const { twoToneJpeg, withExif } = await import("../support/photo-files");
const { toneWav } = await import("../support/capture-files");
const { orderIn, person } = await import("./orders-support");

afterAll(() => sequelize.close());

/** 60 W into 8 Ω at 1 kHz (40 V peak full scale), with 0.2 % second harmonic: ten times the sheet's THD+N. */
const distortedWav = () =>
  toneWav({
    sampleRate: 48_000,
    seconds: 1,
    f0: 1000,
    peak: (Math.sqrt(60 * 8) * Math.SQRT2) / 40,
    harmonics: [1, 0.002],
    bits: "24",
    channels: 1,
  });

async function contested() {
  const clock = testClock();
  const { c, order } = await orderIn("audition", clock);
  await BenchSheet.create({ listingId: c.listing.id, sheet: exampleIntegratedAmplifierSheet(), verdict: null, checkedAt: null });
  const form = new FormData();
  form.set("reason", "measures_below_sheet");
  form.set("note", "It distorts far more than its sheet says at 60 W into 8 ohms.");
  form.set("capture.volts", "40");
  form.set("capture.basis", "peak");
  form.set("capture.loadOhm", "8");
  form.set("capture.channel", "left");
  const photo = withExif(await twoToneJpeg(64, 48), { orientation: 1, gps: true });
  form.append("photos", new File([new Uint8Array(photo)], "hum.jpg", { type: "image/jpeg" }));
  form.append("capture", new File([new Uint8Array(distortedWav())], "left-60w.wav", { type: "audio/wav" }));
  const request = new Request("http://loadline.test/purchases/x?intent=contest", { method: "POST", body: form });
  const result = await submitContest(request, { orderId: order.id, buyerId: c.buyer.id }, clock);
  expect(result).toMatchObject({ ok: true });
  return { c, order, clock, contest: await OrderContest.findByPk(order.id, { rejectOnEmpty: true }) };
}

const get = (href: string) => new Request(`http://loadline.test${href}`);
const paramsOf = (href: string) => {
  const [, , orderId, , n] = new URL(href, "http://x").pathname.split("/");
  return { orderId, n };
};

describe("contest photos", () => {
  it("are kept only without their metadata and open through links for the buyer and moderators, for a few minutes", async () => {
    const { c, order, clock, contest } = await contested();
    const upload = contest.photoKeys[0];
    expect(upload.startsWith(CONTEST_INCOMING_PREFIX)).toBe(true);
    // Before the worker: no link is ready, nothing is served.
    expect(await contestPhotoLinks(order.id, c.buyer, clock)).toEqual([expect.objectContaining({ ready: false })]);
    expect(await cleanContestPhotos({ orderId: order.id })).toEqual({ cleaned: 1, unreadable: 0, missing: 0 });
    expect(await headObject(upload)).toBeNull();
    const clean = (await getObjectBuffer(cleanContestKey(upload)))!;
    expect(clean.subarray(0, 2).toString("hex")).toBe("ffd8");
    expect(clean.includes(Buffer.from("Exif\0\0"))).toBe(false);
    expect(isPublicMediaKey(cleanContestKey(upload))).toBe(false);
    // A second run changes nothing.
    expect(await cleanContestPhotos({ orderId: order.id })).toEqual({ cleaned: 0, unreadable: 0, missing: 0 });

    const [mine] = await contestPhotoLinks(order.id, c.buyer, clock);
    expect(mine.ready).toBe(true);
    const ok = await contestPhotoResponse(get(mine.href), paramsOf(mine.href), c.buyer, clock);
    expect(ok.status).toBe(200);
    expect(ok.headers.get("Content-Type")).toBe("image/jpeg");
    expect(ok.headers.get("Cache-Control")).toBe("private, no-store");
    expect(Buffer.from(await ok.arrayBuffer()).equals(clean)).toBe(true);

    // The seller gets no link and the buyer's link opens nothing for them; a moderator needs their own link.
    expect(await contestPhotoLinks(order.id, c.seller, clock)).toEqual([]);
    expect((await contestPhotoResponse(get(mine.href), paramsOf(mine.href), c.seller, clock)).status).toBe(404);
    expect((await contestPhotoResponse(get(mine.href), paramsOf(mine.href), c.moderator, clock)).status).toBe(404);
    const [theirs] = await contestPhotoLinks(order.id, c.moderator, clock);
    expect((await contestPhotoResponse(get(theirs.href), paramsOf(theirs.href), c.moderator, clock)).status).toBe(200);
    const admin = await person("admin", ["admin"]);
    const [adminLink] = await contestPhotoLinks(order.id, admin, clock);
    expect((await contestPhotoResponse(get(adminLink.href), paramsOf(adminLink.href), admin, clock)).status).toBe(200);

    // A changed expiry breaks the signature; the real one expires.
    const stretched = mine.href.replace(/until=(\d+)/, (_, u: string) => `until=${Number(u) + 3600}`);
    expect((await contestPhotoResponse(get(stretched), paramsOf(stretched), c.buyer, clock)).status).toBe(404);
    clock.advanceMinutes(CONTEST_PHOTO_LINK_SECONDS / 60 - 1);
    expect((await contestPhotoResponse(get(mine.href), paramsOf(mine.href), c.buyer, clock)).status).toBe(200);
    clock.advanceMinutes(1);
    expect((await contestPhotoResponse(get(mine.href), paramsOf(mine.href), c.buyer, clock)).status).toBe(410);
  });
});

describe("a contest's capture", () => {
  it("is analysed by the bench's job and its figures are compared with the sheet like typed ones", async () => {
    const { contest } = await contested();
    expect(contest.captureIds).toHaveLength(1);
    expect(contest.comparison).toBeNull();
    expect(await analyseCaptureJob({ captureId: contest.captureIds[0] })).toEqual({ status: "done" });
    expect(await contestCaptureFinished(contest.captureIds[0])).toBe(true);
    await contest.reload();
    const comparison = remeasurementSchema.parse(contest.comparison);
    const thdN = comparison.rows.find((r) => r.quantity === "thd_n" && r.listed);
    expect(thdN?.outcome).toBe("outside");
    expect(thdN?.listed?.ref).toMatch(/^readings\./);
    expect(comparison.outcome).toBe("differs");
  });
});

describe("the desk's decision", () => {
  it("needs the moderator's claim, and writes the refund to the order's trail with its note", async () => {
    const { c, order, clock } = await contested();
    const other = await person("moderator-2", ["moderator"]);
    expect(await claimForViewer({ type: "order", id: order.id }, c.moderator, clock)).toEqual({ mine: true });
    const refund = { refundMinor: 10_000, note: "Distortion ten times the sheet's: a part refund for the service it needs." };
    await expect(resolveContest(order.id, other.id, refund, clock)).rejects.toMatchObject({ code: "item_taken" });
    expect(await auditTrail({ type: "order", id: order.id })).toEqual([]);
    const after = await resolveContest(order.id, c.moderator.id, refund, clock);
    expect(after.state).toBe("refunded");
    const [line] = await auditTrail({ type: "order", id: order.id });
    expect(line).toMatchObject({ action: "refund_order", note: refund.note, actor: c.moderator.displayName });
    expect(line.after).toMatchObject({ state: "refunded", refundMinor: 10_000 });
  });
});
