import type { Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { refusal, type Issue } from "~/http/errors.server";
import { saveItem, withdrawListing } from "~/listings/drafts.server";
import { publishListing } from "~/listings/publish.server";
import { ListingInputError, ListingNotFound, ListingStateError } from "~/listings/errors.server";
import { listingTitle } from "@shared/catalogue";
import {
  EDITABLE_STATES,
  InventoryActionSchema,
  PUBLISHABLE_STATES,
  WITHDRAWABLE_STATES,
  applyPercent,
  type InventoryAction,
  type InventoryActionResult,
  type UnitOutcome,
} from "@shared/inventory";

// The inventory's bulk actions and inline price edits. Publish goes unit by unit through the review
// step's own path (`publishListing`: the checklist, the bench on the stored sheet, the copied-photo and
// low-price checks, holds for the desk), each unit its own transaction, and reports what happened to
// each. Withdraw, a price change by a percentage, a handling time and one unit's price are one
// transaction for the whole selection: every unit changes, or — when one is not the seller's, or its
// state forbids it (sold, held by a buyer) — none does, and the refusal names each unit that stood in
// the way. Price and handling changes go through the editor's `saveItem`, so its checks and the
// watchers' price-drop notices apply as they do in the editor.

export async function runInventoryAction(user: SessionUser, body: unknown): Promise<InventoryActionResult> {
  const parsed = InventoryActionSchema.safeParse(body);
  if (!parsed.success)
    throw new ListingInputError(parsed.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "body", message: i.message })));
  const action = { ...parsed.data, ids: [...new Set(parsed.data.ids)].sort() };
  if (action.action === "publish") return { action: "publish", outcomes: await publishEach(user, action.ids) };
  return sequelize.transaction(async (transaction) => ({ action: action.action, outcomes: await changeAll(user, action, transaction) }));
}

/** Every id must be one of the seller's units; anyone else's answers as a missing one (404), before anything changes. */
async function ownUnits(sellerId: string, ids: string[], transaction?: Transaction): Promise<Listing[]> {
  const units = await Listing.findAll({
    where: { id: ids, sellerId },
    order: [["id", "ASC"]],
    // Locked in id order, so two overlapping bulk actions wait for each other instead of deadlocking.
    ...(transaction ? { transaction, lock: transaction.LOCK.UPDATE } : {}),
  });
  if (units.length !== ids.length) throw new ListingNotFound();
  return units;
}

async function publishEach(user: SessionUser, ids: string[]): Promise<UnitOutcome[]> {
  const units = await ownUnits(user.id, ids);
  const outcomes: UnitOutcome[] = [];
  for (const unit of units) {
    if (!PUBLISHABLE_STATES.includes(unit.status)) {
      outcomes.push({ id: unit.id, title: titleOf(unit), ok: false, status: unit.status, message: notPublishable(unit) });
      continue;
    }
    try {
      const { listing } = await publishListing(unit.id, user);
      outcomes.push({
        id: listing.id,
        title: titleOf(listing),
        ok: true,
        status: listing.status,
        benchVerified: listing.benchVerified,
        message:
          listing.status === "held"
            ? `Published and waiting at the review desk: ${listing.heldReason ?? "held for review"}.`
            : listing.benchVerified
              ? "Live and bench-verified."
              : "Live.",
      });
    } catch (e) {
      if (!(e instanceof ListingInputError || e instanceof ListingStateError)) throw e;
      const detail = e instanceof ListingInputError && e.issues.length ? e.issues.map((i) => i.message).join(" ") : e.message;
      outcomes.push({ id: unit.id, title: titleOf(unit), ok: false, status: unit.status, message: `Not published. ${detail}` });
    }
  }
  return outcomes;
}

const titleOf = (l: Pick<Listing, "maker" | "model">) => listingTitle(l.maker, l.model);

function notPublishable(unit: Listing): string {
  if (unit.status === "live") return "Already live.";
  if (unit.status === "held") return "Already waiting at the review desk.";
  if (unit.status === "reserved") return "A buyer holds this unit; it stays as it is.";
  if (unit.status === "removed") return "A moderator removed this listing.";
  return "Sold; it cannot go on the market again.";
}

/** Why a unit's state stands in the way of an action, or null when it does not. */
function blocker(unit: Listing, action: Exclude<InventoryAction, { action: "publish" }>): string | null {
  if (action.action === "withdraw") {
    if (WITHDRAWABLE_STATES.includes(unit.status)) return null;
    if (unit.status === "draft") return "A draft is not on the market; there is nothing to withdraw.";
    if (unit.status === "withdrawn") return "Already withdrawn.";
  } else if (EDITABLE_STATES.includes(unit.status)) {
    if (action.action === "reprice" && unit.priceMinor === null) return "Has no price yet to change.";
    return null;
  }
  if (unit.status === "reserved") return "A buyer holds this unit in checkout or an open order; it cannot change meanwhile.";
  if (unit.status === "sold") return "Sold; its listing can no longer change.";
  return "Its state does not allow this.";
}

async function changeAll(
  user: SessionUser,
  action: Exclude<InventoryAction, { action: "publish" }>,
  transaction: Transaction,
): Promise<UnitOutcome[]> {
  const units = await ownUnits(user.id, action.ids, transaction);
  const blocked: Issue[] = units.flatMap((u) => {
    const why = blocker(u, action);
    return why ? [{ path: u.id, message: `${titleOf(u)}: ${why}` }] : [];
  });
  if (action.action === "reprice")
    for (const u of units)
      if (u.priceMinor !== null && !blocker(u, action) && applyPercent(u.priceMinor, action.percent, u.currency) === null)
        blocked.push({ path: u.id, message: `${titleOf(u)}: the new price would be out of bounds.` });
  if (blocked.length)
    throw refusal(
      "conflict",
      blocked.length === 1 ? blocked[0].message : `${blocked.length} of the units cannot take this; nothing changed.`,
      {
        issues: blocked,
      },
    );

  const outcomes: UnitOutcome[] = [];
  for (const unit of units) {
    try {
      const saved = await applyTo(unit, user.id, action, transaction);
      outcomes.push({
        id: saved.id,
        title: titleOf(saved),
        ok: true,
        status: saved.status,
        priceMinor: saved.priceMinor,
        handlingDays: saved.handlingDays,
        message: action.action === "withdraw" ? "Withdrawn." : "Saved.",
      });
    } catch (e) {
      // The editor's own checks refused one unit: the whole action rolls back, naming it.
      if (e instanceof ListingInputError)
        throw new ListingInputError(
          e.issues.map((i) => ({ path: `${unit.id}.${i.path}`, message: `${titleOf(unit)}: ${i.message}` })),
          e.message,
        );
      throw e;
    }
  }
  return outcomes;
}

function applyTo(unit: Listing, sellerId: string, action: Exclude<InventoryAction, { action: "publish" }>, transaction: Transaction) {
  switch (action.action) {
    case "withdraw":
      return withdrawListing(unit.id, sellerId, { transaction });
    case "reprice":
      // blocker() has refused priceless units and out-of-bounds results.
      return saveItem(unit.id, sellerId, { priceMinor: applyPercent(unit.priceMinor!, action.percent, unit.currency) }, { transaction });
    case "handling":
      return saveItem(unit.id, sellerId, { handlingDays: action.handlingDays }, { transaction });
    case "price":
      return saveItem(unit.id, sellerId, { priceMinor: action.priceMinor }, { transaction });
  }
}
