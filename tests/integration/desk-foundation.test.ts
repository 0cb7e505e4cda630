import { afterAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { AuditRecord, DeskClaim } from "~/models/index.server";
import { auditTrail, recordAudit, type DeskSubject } from "~/desk/audit.server";
import { CLAIM_MINUTES, claimForViewer, releaseClaim, requireClaim } from "~/desk/claims.server";
import { openFlags, raiseFlag, resolveFlag } from "~/desk/flags.server";
import { HttpError } from "~/http/errors.server";
import { testClock } from "../support/clock";
import { liveUnit, person } from "./orders-support";

// The desk's foundation: the trail cannot be rewritten (the database refuses it), claims let one
// moderator act and lapse after CLAIM_MINUTES on the injected clock, and flags open and close once.

afterAll(() => sequelize.close());

const listingSubject = (id: string): DeskSubject => ({ type: "listing", id });

describe("the audit trail", () => {
  it("is written with its transaction, read newest first with the actor's name, and cannot be updated or deleted", async () => {
    const mod = await person("trail-mod", ["moderator"]);
    const subject: DeskSubject = { type: "user", id: randomUUID() };
    await sequelize.transaction((t) =>
      recordAudit(
        {
          actorId: mod.id,
          action: "suspend_account",
          subject,
          note: "first",
          before: { status: "active" },
          after: { status: "suspended" },
        },
        t,
      ),
    );
    await sequelize.transaction((t) => recordAudit({ actorId: null, action: "reinstate_account", subject, note: "second" }, t));
    // A rolled-back action leaves no record.
    await expect(
      sequelize.transaction(async (t) => {
        await recordAudit({ actorId: mod.id, action: "suspend_account", subject, note: "rolled back" }, t);
        throw new Error("boom");
      }),
    ).rejects.toThrow("boom");

    const trail = await auditTrail(subject);
    expect(trail.map((i) => [i.action, i.actor, i.note])).toEqual([
      ["reinstate_account", "Loadline", "second"],
      ["suspend_account", "Orders trail-mod", "first"],
    ]);
    expect(trail[1].before).toEqual({ status: "active" });
    expect(trail[1].label).toBe("Suspended the account");

    const id = trail[1].id;
    await expect(sequelize.query(`UPDATE audit_records SET note = 'rewritten' WHERE id = '${id}'`)).rejects.toThrow(/append-only/);
    await expect(sequelize.query(`DELETE FROM audit_records WHERE id = '${id}'`)).rejects.toThrow(/append-only/);
    await expect(AuditRecord.destroy({ where: { id } })).rejects.toThrow(/append-only/);
    expect((await AuditRecord.findByPk(id))?.note).toBe("first");
  });

  it("refuses an empty note", async () => {
    await expect(
      sequelize.transaction((t) =>
        recordAudit({ actorId: null, action: "clear_hold", subject: listingSubject(randomUUID()), note: "  " }, t),
      ),
    ).rejects.toThrow(/note/);
  });
});

describe("claims", () => {
  it("the first to open an item holds it; the second sees who and until when; it lapses after the claim time", async () => {
    const clock = testClock("2026-12-02T14:05:00Z");
    const a = await person("claim-a", ["moderator"]);
    const b = await person("claim-b", ["moderator"]);
    const subject = listingSubject(randomUUID());

    expect(await claimForViewer(subject, a, clock)).toEqual({ mine: true });
    const seen = await claimForViewer(subject, b, clock);
    expect(seen).toEqual({ mine: false, by: "Orders claim-a", until: new Date("2026-12-02T14:20:00Z") });
    // Opening it again renews one's own claim.
    clock.advanceMinutes(10);
    expect(await claimForViewer(subject, a, clock)).toEqual({ mine: true });
    clock.advanceMinutes(CLAIM_MINUTES - 1);
    expect(await claimForViewer(subject, b, clock)).toMatchObject({ mine: false, by: "Orders claim-a" });
    clock.advanceMinutes(1);
    expect(await claimForViewer(subject, b, clock)).toEqual({ mine: true });
    expect(await claimForViewer(subject, a, clock)).toMatchObject({ mine: false, by: "Orders claim-b" });
  });

  it("requireClaim refuses another moderator's unexpired claim with item_taken naming them, takes a free one, and release frees it", async () => {
    const clock = testClock("2026-12-02T09:00:00Z");
    const a = await person("req-a", ["moderator"]);
    const b = await person("req-b", ["moderator"]);
    const subject = listingSubject(randomUUID());
    await claimForViewer(subject, a, clock);

    const refused = await sequelize.transaction((t) => requireClaim(subject, b.id, t, clock)).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(HttpError);
    expect(refused).toMatchObject({ status: 409, code: "item_taken" });
    expect((refused as HttpError).message).toContain("Orders req-a until 09:15 UTC");

    await sequelize.transaction(async (t) => {
      await requireClaim(subject, a.id, t, clock);
      await releaseClaim(subject, t);
    });
    expect(await DeskClaim.findOne({ where: { subjectId: subject.id } })).toBeNull();
    // Free now: B's action takes it.
    await sequelize.transaction((t) => requireClaim(subject, b.id, t, clock));
    expect((await DeskClaim.findOne({ where: { subjectId: subject.id } }))?.moderatorId).toBe(b.id);
  });

  it("two moderators racing for a free item: exactly one passes", async () => {
    const clock = testClock("2026-12-02T09:00:00Z");
    const mods = await Promise.all([person("race-a", ["moderator"]), person("race-b", ["moderator"]), person("race-c", ["moderator"])]);
    const subject = listingSubject(randomUUID());
    const results = await Promise.allSettled(
      mods.map((m) =>
        sequelize.transaction(async (t) => {
          await requireClaim(subject, m.id, t, clock);
          // Hold the row a moment so the others queue behind it.
          await sequelize.query("SELECT pg_sleep(0.05)", { transaction: t });
        }),
      ),
    );
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
    for (const r of results.filter((r) => r.status === "rejected")) expect(r.reason).toMatchObject({ code: "item_taken" });
  });
});

describe("flags", () => {
  it("raise, list open ones oldest first, resolve once", async () => {
    const seller = await person("flag-seller", ["seller"]);
    const reporter = await person("flag-reporter");
    const mod = await person("flag-mod", ["moderator"]);
    const listing = await liveUnit(seller.id, { publishedAt: new Date("2020-01-01T00:00:00Z") });
    const first = await raiseFlag({ kind: "low_price", listingId: listing.id, reason: "under_index", details: { medianMinor: 100_000 } });
    const second = await raiseFlag({
      kind: "report",
      listingId: listing.id,
      reporterId: reporter.id,
      reason: "misdescribed",
      note: "Not the model shown",
    });
    // One open report per person and item.
    await expect(raiseFlag({ kind: "report", listingId: listing.id, reporterId: reporter.id, reason: "other" })).rejects.toThrow();

    const open = await openFlags(listing.id);
    expect(open.map((f) => f.id)).toEqual([first.id, second.id]);
    expect(open[1].reporter?.displayName).toBe("Orders flag-reporter");

    const resolved = await sequelize.transaction((t) => resolveFlag(first.id, mod.id, "dismissed", t));
    expect(resolved?.resolution).toBe("dismissed");
    expect(await sequelize.transaction((t) => resolveFlag(first.id, mod.id, "dismissed", t))).toBeNull();
    expect((await openFlags(listing.id)).map((f) => f.id)).toEqual([second.id]);
    await listing.destroy();
  });
});
