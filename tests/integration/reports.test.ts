import { afterAll, beforeAll, describe, expect, it } from "vitest";

// Reports: any signed-in account reports a public listing that is not its own, and either side reports
// their conversation; each becomes an open desk flag of kind 'report' with its reason and note, one
// open report per person and item. A reported conversation is read-only on the desk, where a
// moderator dismisses a report with a note that goes on the conversation's trail.

const { sequelize } = await import("~/db.server");
const { AuditRecord, DeskFlag, User } = await import("~/models/index.server");
const { HttpError } = await import("~/http/errors.server");
const { openThread, sendMessage } = await import("~/messages/threads.server");
const { listingReportPage, threadReportPage, submitReport } = await import("~/reports/reports.server");
const { deskThreadPage, dismissThreadReport } = await import("~/reports/desk-thread.server");
const { testClock } = await import("../support/clock");
const { account, cleanUp, liveUnit } = await import("./talk-support");

type Account = Awaited<ReturnType<typeof account>>;
let seller: Account;
let buyer: Account;
let stranger: Account;
// The moderator is not cleaned up: the trail it writes refuses to lose its actor.
let moderator: InstanceType<typeof User>;
beforeAll(async () => {
  seller = await account("rp-seller", ["buyer", "seller"]);
  buyer = await account("rp-buyer");
  stranger = await account("rp-stranger");
  moderator = await User.create({
    email: `reports-it-${seller.id.slice(0, 8)}-moderator@example.test`,
    displayName: "Reports moderator",
    passwordHash: null,
    roles: ["buyer", "moderator"],
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

const asViewer = (u: InstanceType<typeof User>) => ({
  id: u.id,
  email: u.email,
  displayName: u.displayName,
  roles: u.roles,
  emailVerified: true,
});

async function refusal(call: () => Promise<unknown>): Promise<string> {
  try {
    await call();
  } catch (e) {
    if (e instanceof HttpError) return `${e.status} ${e.code}`;
    throw e;
  }
  return "no refusal";
}

describe("reporting a listing", () => {
  it("raises one open report flag with the reason and note; a second is refused until the first is dealt with", async () => {
    const unit = await liveUnit(seller.id);
    const note = "The photos show a different front panel from the one described.";
    expect(await submitReport(buyer.id, "listing", unit.id, { reason: "not_as_described", note })).toEqual({ ok: true });
    const flags = await DeskFlag.findAll({ where: { listingId: unit.id } });
    expect(flags.map((f) => [f.kind, f.reason, f.note, f.reporterId, f.threadId, f.resolvedAt])).toEqual([
      ["report", "not_as_described", note, buyer.id, null, null],
    ]);
    expect((await listingReportPage(buyer.id, unit.id)).reportedAt).toBe(flags[0].createdAt.toISOString());
    expect((await listingReportPage(stranger.id, unit.id)).reportedAt).toBeNull();

    const twice = await submitReport(buyer.id, "listing", unit.id, { reason: "suspected_fraud", note: "And the price is far too low." });
    expect(twice).toMatchObject({ ok: false, status: 409, errors: { _form: expect.stringMatching(/reported this already/) } });
    // Someone else may report the same listing.
    expect(
      await submitReport(stranger.id, "listing", unit.id, { reason: "suspected_fraud", note: "Asked me to pay by bank transfer." }),
    ).toEqual({ ok: true });
    expect(await DeskFlag.count({ where: { listingId: unit.id } })).toBe(2);

    // Dealt with, the buyer may report it again.
    await flags[0].update({ resolvedAt: new Date(), resolvedBy: moderator.id, resolution: "dismissed" });
    expect(
      await submitReport(buyer.id, "listing", unit.id, { reason: "suspected_fraud", note: "Now the serial number is different too." }),
    ).toEqual({ ok: true });
  });

  it("checks the reason and the note beside their fields", async () => {
    const unit = await liveUnit(seller.id);
    const bad = await submitReport(buyer.id, "listing", unit.id, { reason: "pay_outside", note: "short" });
    expect(bad).toMatchObject({
      ok: false,
      status: 400,
      errors: { reason: "Choose what is wrong.", note: expect.stringMatching(/at least 10/) },
    });
    expect(await DeskFlag.count({ where: { listingId: unit.id } })).toBe(0);
  });

  it("is not for the seller's own listing, nor a listing the public cannot see", async () => {
    const unit = await liveUnit(seller.id);
    expect(await refusal(() => submitReport(seller.id, "listing", unit.id, { reason: "other", note: "Testing my own listing." }))).toBe(
      "403 forbidden",
    );
    const draft = await liveUnit(seller.id, { status: "draft" });
    expect(await refusal(() => listingReportPage(buyer.id, draft.id))).toBe("404 not_found");
    expect(await refusal(() => submitReport(buyer.id, "listing", draft.id, { reason: "other", note: "Something is off here." }))).toBe(
      "404 not_found",
    );
    expect(await refusal(() => listingReportPage(buyer.id, "not-an-id"))).toBe("404 not_found");
  });
});

describe("reporting a conversation", () => {
  it("either side reports it; on the desk it is read-only with its reports, and a dismissal goes on its trail", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(buyer.id, unit.id);
    await sendMessage(seller.id, thread.id, "Pay me directly to save the fees: call 0612 345 678.");
    // Only its two sides may report it; for anyone else it does not exist.
    expect(await refusal(() => threadReportPage(stranger.id, thread.id))).toBe("404 not_found");
    expect(await refusal(() => submitReport(stranger.id, "thread", thread.id, { reason: "spam", note: "I was never part of this." }))).toBe(
      "404 not_found",
    );
    expect(await submitReport(buyer.id, "thread", thread.id, { reason: "pay_outside", note: "Asked me to pay outside Loadline." })).toEqual(
      { ok: true },
    );
    const flag = await DeskFlag.findOne({ where: { threadId: thread.id }, rejectOnEmpty: true });
    expect(flag).toMatchObject({
      kind: "report",
      reason: "pay_outside",
      listingId: null,
      reporterId: buyer.id,
      details: { listingId: unit.id },
    });

    const clock = testClock(new Date());
    const page = await deskThreadPage(asViewer(moderator), thread.id, clock);
    expect(page.reports).toMatchObject([{ id: flag.id, reason: "Asks to pay or talk outside Loadline", resolution: null }]);
    // As stored: the phone number was masked before the buyer paid.
    expect(page.lines).toHaveLength(1);
    expect(page.lines[0]).toMatchObject({ side: "seller", masked: true });
    expect(page.lines[0].text).not.toContain("0612 345 678");
    expect(page.claim).toEqual({ mine: true });

    const noNote = await dismissThreadReport(asViewer(moderator), thread.id, { flagId: flag.id, note: "" }, clock);
    expect(noNote).toMatchObject({ ok: false, status: 400, errors: { note: expect.any(String) } });
    expect(
      await dismissThreadReport(asViewer(moderator), thread.id, { flagId: flag.id, note: "Number was masked; warned the seller." }, clock),
    ).toEqual({ ok: true });
    await flag.reload();
    expect(flag).toMatchObject({ resolution: "dismissed", resolvedBy: moderator.id });
    const trail = await AuditRecord.findAll({ where: { subjectType: "thread", subjectId: thread.id } });
    expect(trail.map((r) => [r.action, r.note])).toEqual([["dismiss_flag", "Number was masked; warned the seller."]]);
    expect((await deskThreadPage(asViewer(moderator), thread.id, clock)).trail.map((t) => t.note)).toEqual([
      "Number was masked; warned the seller.",
    ]);
    // Dismissed once: a second dismissal is refused and leaves the trail as it was.
    expect(await dismissThreadReport(asViewer(moderator), thread.id, { flagId: flag.id, note: "Again." }, clock)).toMatchObject({
      ok: false,
      status: 409,
    });
    expect(await AuditRecord.count({ where: { subjectType: "thread", subjectId: thread.id } })).toBe(1);
  });
});
