import { afterAll, describe, expect, it, vi } from "vitest";

// A moderator's actions through the modules the desk pages call: each needs a note, writes the change,
// its audit record and the mail job in one transaction, and is refused (changing nothing) to a second
// moderator while the first holds the item. Asking for changes sends the listing back to the seller's
// drafts with the note; publishing it again returns it to the queue.
const sent = vi.hoisted((): { to: string; subject: string; text: string }[] => []);
vi.mock("~/services/mail.server", () => ({
  sendMail: async (m: { to: string; subject: string; text: string }) => {
    sent.push(m);
    return { messageId: "test" };
  },
}));

const { sequelize } = await import("~/db.server");
const { AuditRecord, Listing, User } = await import("~/models/index.server");
const { actOnListing } = await import("~/desk/listing-actions.server");
const { actOnUser } = await import("~/desk/user-desk.server");
const { claimForViewer, CLAIM_MINUTES } = await import("~/desk/claims.server");
const { raiseFlag, openFlags } = await import("~/desk/flags.server");
const { deskQueue } = await import("~/desk/queue.server");
const { deliverDeskMail } = await import("~/desk/mail.server");
const { publishListing, RESUBMITTED_REASON } = await import("~/listings/publish.server");
const { QUEUES } = await import("~/services/jobs.server");
const { testClock } = await import("../support/clock");
const { makeAccount, readyDraft, withOwnCaptures } = await import("./listing-support");
const { saveBenchSheet } = await import("~/listings/bench.server");
const { exampleIntegratedAmplifierSheet } = await import("@shared/bench");
const { liveUnit, orderIn, person } = await import("./orders-support");
const { deskOrderPage } = await import("~/buying/desk-order.server");

afterAll(() => sequelize.close());

const OLD = new Date("2020-03-01T10:00:00Z");

async function heldUnit(sellerId: string) {
  return liveUnit(sellerId, { status: "held", heldReason: "Bench check: power — implausible.", publishedAt: OLD });
}

async function trailOf(id: string) {
  return AuditRecord.findAll({ where: { subjectId: id }, order: [["createdAt", "ASC"]] });
}

async function deskMailJobs(auditIds: string[]) {
  const [rows] = await sequelize.query(`SELECT data FROM pgboss.job WHERE name = $1 AND data->>'auditId' = ANY($2)`, {
    bind: [QUEUES.deskMail, auditIds],
  });
  return (rows as { data: { auditId: string; to: string } }[]).map((r) => r.data);
}

const moderator = (label: string) => person(label, ["moderator"]);

describe("clearing a hold", () => {
  it("needs a note; with one the listing goes live, the trail keeps the note, the seller's mail is queued and says it", async () => {
    const clock = testClock();
    const seller = await person("clear-seller", ["seller"]);
    const mod = await moderator("clear-mod");
    const unit = await heldUnit(seller.id);

    const empty = await actOnListing(mod, unit.id, { intent: "clear_hold", note: "   " }, clock);
    expect(empty).toMatchObject({ ok: false, status: 400, errors: { note: expect.stringContaining("Write a note") } });
    expect((await Listing.findByPk(unit.id))?.status).toBe("held");
    expect(await trailOf(unit.id)).toHaveLength(0);

    expect(await actOnListing(mod, unit.id, { intent: "clear_hold", note: "Power figure rechecked against the capture." }, clock)).toEqual({
      ok: true,
      intent: "clear_hold",
    });
    const after = await Listing.findByPk(unit.id);
    expect(after).toMatchObject({ status: "live", heldReason: null });
    const [record] = await trailOf(unit.id);
    expect(record).toMatchObject({ action: "clear_hold", actorId: mod.id, note: "Power figure rechecked against the capture." });
    expect(record.before).toMatchObject({ status: "held" });
    expect(record.after).toMatchObject({ status: "live" });
    expect(await deskMailJobs([record.id])).toEqual([{ auditId: record.id, to: seller.id }]);

    await deliverDeskMail({ auditId: record.id, to: seller.id });
    const mail = sent.find((m) => m.to === seller.email);
    expect(mail?.subject).toMatch(/^Live: /);
    expect(mail?.text).toContain("Power figure rechecked against the capture.");

    // Cleared once: a second clear is refused as the item has moved on.
    const again = await actOnListing(mod, unit.id, { intent: "clear_hold", note: "again" }, clock);
    expect(again).toMatchObject({ ok: false, status: 409 });
  });
});

describe("two moderators", () => {
  it("the second is refused while the first holds the item (nothing written), and may act once the claim lapses", async () => {
    const clock = testClock("2026-12-02T14:05:00Z");
    const seller = await person("race-seller", ["seller"]);
    const first = await moderator("first");
    const second = await moderator("second");
    const unit = await heldUnit(seller.id);

    expect(await claimForViewer({ type: "listing", id: unit.id }, { id: first.id, displayName: first.displayName }, clock)).toEqual({
      mine: true,
    });
    const refused = await actOnListing(second, unit.id, { intent: "remove_listing", note: "Looks copied." }, clock);
    expect(refused).toEqual({ ok: false, status: 409, errors: { form: expect.stringContaining("Taken by Orders first until 14:20 UTC") } });
    expect((await Listing.findByPk(unit.id))?.status).toBe("held");
    expect(await trailOf(unit.id)).toHaveLength(0);

    clock.advanceMinutes(CLAIM_MINUTES);
    expect(await actOnListing(second, unit.id, { intent: "remove_listing", note: "Looks copied." }, clock)).toMatchObject({ ok: true });
    expect((await Listing.findByPk(unit.id))?.status).toBe("removed");
  });
});

describe("asking for changes", () => {
  it("sends the listing back to draft with the note; publishing again holds it as resubmitted and it is back in the queue", async () => {
    const clock = testClock();
    const seller = await makeAccount(`changes-${Date.now()}`);
    const mod = await moderator("changes-mod");
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
    await draft.update({ status: "held", heldReason: "Reported photos", publishedAt: OLD });

    const note = "Show the rear panel, and say which capacitors were replaced.";
    expect(await actOnListing(mod, draft.id, { intent: "ask_changes", note }, clock)).toMatchObject({ ok: true });
    expect(await Listing.findByPk(draft.id)).toMatchObject({ status: "draft", reviewNote: note, heldReason: null });
    expect((await deskQueue({ kind: "held_listing" })).items.map((i) => i.subject.id)).not.toContain(draft.id);

    const { listing } = await publishListing(draft.id, seller.session);
    expect(listing.status).toBe("held");
    expect(listing.heldReason).toBe(RESUBMITTED_REASON);
    const queue = await deskQueue({ kind: "held_listing" });
    const item = queue.items.find((i) => i.subject.id === draft.id);
    expect(item?.summary).toContain(RESUBMITTED_REASON);
    expect(item?.href).toBe(`/desk/listings/${draft.id}`);

    expect(await actOnListing(mod, draft.id, { intent: "clear_hold", note: "Rear panel shown; log complete." }, clock)).toMatchObject({
      ok: true,
    });
    expect(await Listing.findByPk(draft.id)).toMatchObject({ status: "live", reviewNote: null });
    expect((await trailOf(draft.id)).map((r) => [r.action, r.note])).toEqual([
      ["ask_changes", note],
      ["clear_hold", "Rear panel shown; log complete."],
    ]);
    await Listing.update({ status: "withdrawn" }, { where: { id: draft.id } });
  });
});

describe("flags", () => {
  it("dismissing a report resolves that flag only and mails the reporter; removing the listing resolves the rest", async () => {
    const clock = testClock();
    const seller = await person("flag-seller", ["seller"]);
    const reporter = await person("flag-reporter");
    const mod = await moderator("flag-mod");
    const unit = await liveUnit(seller.id, { publishedAt: OLD });
    const report = await raiseFlag({
      kind: "report",
      listingId: unit.id,
      reporterId: reporter.id,
      reason: "misdescribed",
      note: "Wrong model",
    });
    await raiseFlag({ kind: "low_price", listingId: unit.id, reason: "under_index", details: { medianMinor: 120_000, currency: "EUR" } });
    expect((await deskQueue({ kind: "report" })).items.map((i) => i.href)).toContain(`/desk/listings/${unit.id}`);

    const missing = await actOnListing(mod, unit.id, { intent: "dismiss_flag", note: "Fine." }, clock);
    expect(missing).toMatchObject({ ok: false, status: 400, errors: { flagId: expect.any(String) } });
    expect(
      await actOnListing(mod, unit.id, { intent: "dismiss_flag", flagId: report.id, note: "Model checked against the photos." }, clock),
    ).toMatchObject({
      ok: true,
    });
    expect((await openFlags(unit.id)).map((f) => f.kind)).toEqual(["low_price"]);
    const [dismissal] = await trailOf(unit.id);
    expect(await deskMailJobs([dismissal.id])).toEqual([{ auditId: dismissal.id, to: reporter.id }]);

    expect(await actOnListing(mod, unit.id, { intent: "remove_listing", note: "Price bait." }, clock)).toMatchObject({ ok: true });
    expect(await openFlags(unit.id)).toHaveLength(0);
    expect((await Listing.findByPk(unit.id))?.status).toBe("removed");
  });
});

describe("suspending an account", () => {
  it("withdraws their live and held listings, leaves others alone, ends sign-in; reinstating opens it again", async () => {
    const clock = testClock();
    const seller = await person("suspend-seller", ["seller"]);
    const mod = await moderator("suspend-mod");
    const live = await liveUnit(seller.id, { publishedAt: OLD });
    const held = await heldUnit(seller.id);
    const sold = await liveUnit(seller.id, { status: "sold", publishedAt: OLD });

    const done = await actOnUser(mod, seller.id, { intent: "suspend_account", note: "Several buyers report missing parcels." }, clock);
    expect(done).toEqual({ ok: true, intent: "suspend_account", withdrawn: 2 });
    expect((await User.findByPk(seller.id))?.status).toBe("suspended");
    expect((await Listing.findByPk(live.id))?.status).toBe("withdrawn");
    expect((await Listing.findByPk(held.id))?.status).toBe("withdrawn");
    expect((await Listing.findByPk(sold.id))?.status).toBe("sold");
    const [record] = await trailOf(seller.id);
    expect(record.after).toEqual({ status: "suspended", withdrawnListingIds: expect.arrayContaining([live.id, held.id]) });

    expect(await actOnUser(mod, seller.id, { intent: "suspend_account", note: "again" }, clock)).toMatchObject({ ok: false, status: 409 });
    expect(await actOnUser(mod, seller.id, { intent: "reinstate_account", note: "Parcels found at the depot." }, clock)).toMatchObject({
      ok: true,
    });
    expect((await User.findByPk(seller.id))?.status).toBe("active");
  });

  it("a suspended seller's open order runs on, marked for the desk as under watch", async () => {
    const clock = testClock();
    const { c, order } = await orderIn("shipped", clock);
    const mod = await moderator("suspend-watch-mod");
    expect((await deskOrderPage(mod, order.id, clock)).sellerSuspended).toBe(false);
    expect(
      await actOnUser(mod, c.seller.id, { intent: "suspend_account", note: "Buyers report parcels never sent." }, clock),
    ).toMatchObject({
      ok: true,
    });
    const page = await deskOrderPage(mod, order.id, clock);
    expect(page.sellerSuspended).toBe(true);
    expect(page.view.state).toBe("shipped");
  });

  it("a moderator cannot suspend themselves, and only an admin may suspend a moderator", async () => {
    const clock = testClock();
    const mod = await moderator("self-mod");
    const other = await moderator("other-mod");
    const admin = await person("admin", ["admin"]);
    expect(await actOnUser(mod, mod.id, { intent: "suspend_account", note: "x" }, clock)).toMatchObject({ ok: false, status: 409 });
    expect(await actOnUser(mod, other.id, { intent: "suspend_account", note: "x" }, clock)).toMatchObject({ ok: false, status: 403 });
    expect(
      await actOnUser({ id: admin.id, roles: ["admin"] }, other.id, { intent: "suspend_account", note: "Shared account." }, clock),
    ).toMatchObject({
      ok: true,
    });
  });
});
