import { afterAll, describe, expect, it, vi } from "vitest";

// The buyer's side of the audition window through the server module the purchase page calls: a contest
// with private photos and figures compared with the bench sheet, stored with the transition; refusals
// keep nothing (no contest row, no photo left in storage); accepting with matching figures stores them.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));
// Every key the module streams to storage, so a test can check that a refused contest left none behind.
const written = vi.hoisted((): string[] => []);
vi.mock("~/services/storage.server", async (importOriginal) => {
  const real = await importOriginal<typeof import("~/services/storage.server")>();
  return {
    ...real,
    putObjectStream: (key: string, ...rest: [AsyncIterable<Uint8Array>, { contentType: string }]) => {
      written.push(key);
      return real.putObjectStream(key, ...rest);
    },
  };
});

const { sequelize } = await import("~/db.server");
const { BenchSheet, OrderContest, Order } = await import("~/models/index.server");
const { OrderRemeasurement } = await import("~/models/order-remeasurement.server");
const { headObject } = await import("~/services/storage.server");
const { submitContest, acceptWithReadings, CONTEST_PHOTO_PREFIX } = await import("~/orders/contest.server");
const { figureField } = await import("~/orders/readings-form");
const { exampleIntegratedAmplifierSheet } = await import("@shared/bench/examples");
const { remeasurementSchema } = await import("@shared/bench/remeasure-schema");
const { testClock } = await import("../support/clock");
const { twoToneJpeg, textFile } = await import("../support/photo-files");
const { orderIn, refusalOf } = await import("./orders-support");

afterAll(() => sequelize.close());

async function auditionWithSheet() {
  const clock = testClock();
  const { c, order } = await orderIn("audition", clock);
  await BenchSheet.create({ listingId: c.listing.id, sheet: exampleIntegratedAmplifierSheet(), verdict: null, checkedAt: null });
  return { c, order, clock };
}

function multipart(fields: Record<string, string>, photos: { name: string; bytes: Buffer; type: string }[] = []): Request {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  for (const p of photos) form.append("photos", new File([new Uint8Array(p.bytes)], p.name, { type: p.type }));
  return new Request("http://loadline.test/purchases/x?intent=contest", { method: "POST", body: form });
}

function urlencoded(fields: Record<string, string>): Request {
  return new Request("http://loadline.test/purchases/x?intent=accept", {
    method: "POST",
    headers: { "Content-Type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(fields).toString(),
  });
}

describe("contesting", () => {
  it("stores reason, note, a private photo and the figures, compared: 30 % less power is outside and the whole differs", async () => {
    const { c, order, clock } = await auditionWithSheet();
    const jpeg = await twoToneJpeg(64, 48);
    const result = await submitContest(
      multipart(
        {
          reason: "measures_below_sheet",
          note: "Left channel clips at about 46 W into my 8 ohm load.",
          [figureField("readings.3")]: "46.2 W",
          [figureField("readings.9")]: "0.02 %",
        },
        [{ name: "clipping.jpg", bytes: jpeg, type: "image/jpeg" }],
      ),
      { orderId: order.id, buyerId: c.buyer.id },
      clock,
    );
    expect(result.ok).toBe(true);
    expect((await Order.findByPk(order.id))?.state).toBe("contested");
    const contest = await OrderContest.findByPk(order.id, { rejectOnEmpty: true });
    expect(contest.reason).toBe("measures_below_sheet");
    expect(contest.photoKeys).toHaveLength(1);
    expect(contest.photoKeys[0].startsWith(CONTEST_PHOTO_PREFIX)).toBe(true);
    expect((await headObject(contest.photoKeys[0]))?.contentType).toBe("image/jpeg");
    const comparison = remeasurementSchema.parse(contest.comparison);
    expect(comparison.outcome).toBe("differs");
    expect(comparison.rows.map((r) => [r.listed?.ref, r.outcome])).toEqual([
      ["readings.3", "outside"],
      ["readings.9", "within"],
    ]);
  });

  it("puts each refusal beside its field and keeps nothing: no contest, the order still in audition, the photo removed", async () => {
    const { c, order, clock } = await auditionWithSheet();
    written.length = 0;
    const result = await submitContest(
      multipart({ reason: "", note: "short", [figureField("readings.3")]: "46 Hz" }, [
        { name: "fine.jpg", bytes: await twoToneJpeg(32, 32), type: "image/jpeg" },
        { name: "notes.jpg", bytes: textFile(), type: "image/jpeg" },
      ]),
      { orderId: order.id, buyerId: c.buyer.id },
      clock,
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(Object.keys(result.errors).sort()).toEqual([figureField("readings.3"), "note", "photos", "reason"].sort());
    expect(result.values[figureField("readings.3")]).toBe("46 Hz");
    expect((await Order.findByPk(order.id))?.state).toBe("audition");
    expect(await OrderContest.findByPk(order.id)).toBeNull();
    // The good photo was stored as it arrived, then removed when the form was refused.
    expect(written).toHaveLength(1);
    expect(await headObject(written[0])).toBeNull();
  });

  it("after the window closes the contest is refused beside the form, and someone else's order is a 404", async () => {
    const { c, order, clock } = await auditionWithSheet();
    clock.advanceDays(30);
    const late = await submitContest(
      multipart({ reason: "fault", note: "It hums loudly on the left." }),
      { orderId: order.id, buyerId: c.buyer.id },
      clock,
    );
    expect(late.ok === false && late.errors._form).toMatch(/audition window has closed/);
    expect(
      await refusalOf(() =>
        submitContest(multipart({ reason: "fault", note: "x".repeat(20) }), { orderId: order.id, buyerId: c.stranger.id }, clock),
      ),
    ).toBe("not_found");
  });
});

describe("accepting with the buyer's own figures", () => {
  it("stores matching figures with the acceptance and releases the order", async () => {
    const { c, order, clock } = await auditionWithSheet();
    const result = await acceptWithReadings(
      urlencoded({ [figureField("readings.3")]: "64 W", [figureField("readings.4")]: "18 dBW", equipment: "Sound-card analyser" }),
      { orderId: order.id, buyerId: c.buyer.id },
      clock,
    );
    expect(result.ok).toBe(true);
    expect((await Order.findByPk(order.id))?.state).toBe("released");
    const stored = await OrderRemeasurement.findByPk(order.id, { rejectOnEmpty: true });
    expect(stored.readings?.readings).toHaveLength(2);
    expect(stored.readings?.equipment).toBe("Sound-card analyser");
    expect(stored.comparison?.outcome).toBe("matches");
  });

  it("accepts without figures and stores none; a figure that does not read keeps the order in audition", async () => {
    const a = await auditionWithSheet();
    const bad = await acceptWithReadings(
      urlencoded({ [figureField("readings.3")]: "lots" }),
      { orderId: a.order.id, buyerId: a.c.buyer.id },
      a.clock,
    );
    expect(bad.ok === false && Object.keys(bad.errors)).toEqual([figureField("readings.3")]);
    expect((await Order.findByPk(a.order.id))?.state).toBe("audition");
    const plain = await acceptWithReadings(urlencoded({}), { orderId: a.order.id, buyerId: a.c.buyer.id }, a.clock);
    expect(plain.ok).toBe(true);
    expect(await OrderRemeasurement.findByPk(a.order.id)).toBeNull();
  });
});

describe("through the purchase page's action (?intent=…)", () => {
  const BASE = "http://127.0.0.1";
  // The page uses the system clock (app/buying/clock.server.ts); the test orders' windows are still open then.
  async function act(orderId: string, intent: string, body: FormData, who: { id: string }) {
    const { routeArgs, isData } = await import("../support/route-args");
    const { signedInCookie } = await import("../support/sessions");
    const purchase = await import("~/routes/buying/purchase");
    const request = new Request(`${BASE}/purchases/${orderId}?intent=${intent}`, {
      method: "POST",
      body,
      headers: { Origin: BASE, Cookie: await signedInCookie(who) },
    });
    try {
      const out = await purchase.action(routeArgs(request, { orderId }));
      if (out instanceof Response) return { status: out.status, body: null };
      if (isData(out)) return { status: out.init?.status ?? 200, body: out.data as { audition?: { errors: Record<string, string> } } };
      return { status: 200, body: null };
    } catch (thrown) {
      if (thrown instanceof Response) return { status: thrown.status, body: null };
      if (isData(thrown)) return { status: thrown.init?.status ?? 500, body: null };
      throw thrown;
    }
  }

  it("a contest posts multipart and redirects; a missing reason comes back beside its field; someone else's order is a 404", async () => {
    const { c, order } = await auditionWithSheet();
    const bad = new FormData();
    bad.append("note", "It hums loudly from the left speaker.");
    const refused = await act(order.id, "contest", bad, c.buyer);
    expect(refused.status).toBe(400);
    expect(Object.keys(refused.body?.audition?.errors ?? {})).toEqual(["reason"]);
    const stranger = await act(order.id, "contest", bad, c.stranger);
    expect(stranger.status).toBe(404);
    const good = new FormData();
    good.append("reason", "fault");
    good.append("note", "It hums loudly from the left speaker.");
    good.append("photos", new File([new Uint8Array(await twoToneJpeg(32, 32))], "hum.jpg", { type: "image/jpeg" }));
    const done = await act(order.id, "contest", good, c.buyer);
    expect(done.status).toBe(302);
    const contest = await OrderContest.findByPk(order.id, { rejectOnEmpty: true });
    expect(contest.photoKeys).toHaveLength(1);
  });
});
