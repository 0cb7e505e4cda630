import { Op, type Transaction } from "sequelize";
import { isId } from "@shared/ids";
import { offerActions, type OfferParty } from "@shared/offers";
import { formatPrice } from "@shared/money";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import { Offer } from "~/models/offer.server";
import { refusal } from "~/http/errors.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { canViewListing } from "~/listings/visibility";
import type { Role } from "~/auth/roles";
import { openThread, touchThread } from "~/messages/threads.server";
import { threadFor } from "~/messages/access.server";
import type { OfferAnswer } from "~/messages/schemas";
import { offerTimes } from "./settings.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import type { OfferMailEvent } from "./offer-mail.server";

// Offers: a buyer offers an amount on a unit whose seller welcomes offers; the seller accepts,
// declines or counters (a counter is a new open offer, made by the seller, whose parent is the one it
// answers); the buyer accepts or declines a counter. Every step is one transaction that also moves
// the thread (offers show in the conversation) and queues its mails; an open offer's expiry is a
// deferred job that re-reads the row. An accepted offer holds its price for the buyer's checkout.

const HOUR = 3_600_000;
const EXPIRY_GRACE_MS = 60_000;

export interface OfferOutcome {
  offerId: string;
  threadId: string | null;
  state: Offer["state"];
}

interface Actor {
  id: string;
  roles: readonly Role[];
}

function invalid(path: string, message: string) {
  return refusal("invalid", message, { issues: [{ path, message }] });
}

function checkAmount(listing: Listing, amountMinor: number, currency: string) {
  if (currency !== listing.currency) throw invalid("currency", `Offers on this unit are in ${listing.currency}.`);
  if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0)
    throw invalid("amountMinor", "An offer must be a whole amount above nothing.");
  if (listing.priceMinor === null || amountMinor > listing.priceMinor)
    throw invalid("amountMinor", `An offer cannot be above the asking price (${formatPrice(listing.priceMinor ?? 0, listing.currency)}).`);
}

async function queueSteps(offer: Offer, event: OfferMailEvent, transaction: Transaction) {
  await enqueue(QUEUES.offerMail, { offerId: offer.id, event }, { transaction });
  if (offer.state === "open") {
    // Runs at the deadline and re-reads the offer: an answered one is left alone.
    await enqueue(
      QUEUES.offerExpiry,
      { offerId: offer.id },
      { transaction, startAfter: offer.expiresAt, singletonKey: `offer:${offer.id}:expiry` },
    );
  }
}

/** A buyer's offer on a listing. */
export async function makeOffer(
  buyer: Actor,
  input: { listingId: string; amountMinor: number; currency: string },
  clock: Clock = systemClock,
): Promise<OfferOutcome> {
  const now = clock.now();
  return sequelize.transaction(async (transaction) => {
    const listing = isId(input.listingId) ? await Listing.findByPk(input.listingId, { transaction, lock: transaction.LOCK.SHARE }) : null;
    if (!listing || !canViewListing(listing.status, listing.sellerId, buyer)) throw refusal("not_found", "There is no listing here.");
    if (listing.sellerId === buyer.id) throw refusal("conflict", "This is your own listing.");
    if (listing.status !== "live") throw refusal("conflict", "This unit is not for sale at the moment.");
    if (!listing.offersWelcome) throw refusal("conflict", "The seller does not take offers on this unit.");
    checkAmount(listing, input.amountMinor, input.currency);
    const standing = await Offer.findOne({
      where: {
        listingId: listing.id,
        buyerId: buyer.id,
        [Op.or]: [
          { state: "open", expiresAt: { [Op.gt]: now } },
          { state: "accepted", checkoutUntil: { [Op.gt]: now } },
        ],
      },
      transaction,
    });
    if (standing?.state === "open")
      throw refusal("conflict", "You already have an offer open on this unit: wait for the answer, or withdraw it first.");
    if (standing) throw refusal("conflict", "Your offer on this unit was accepted: you can buy it at that price now.");
    // An open offer past its time whose expiry job has not run yet gives way to the new one.
    await Offer.update(
      { state: "expired", decidedAt: now },
      { where: { listingId: listing.id, buyerId: buyer.id, state: "open", expiresAt: { [Op.lte]: now } }, transaction },
    );
    const thread = await openThread(buyer.id, listing.id, transaction);
    const { offerHours } = await offerTimes(transaction);
    const offer = await Offer.create(
      {
        listingId: listing.id,
        buyerId: buyer.id,
        sellerId: listing.sellerId,
        threadId: thread.id,
        amountMinor: input.amountMinor,
        currency: listing.currency,
        madeBy: "buyer",
        parentOfferId: null,
        expiresAt: new Date(now.getTime() + offerHours * HOUR),
        acceptedAt: null,
        checkoutUntil: null,
        decidedAt: null,
        createdAt: now,
        updatedAt: now,
      },
      { transaction },
    );
    await touchThread(thread, "buyer", now, transaction);
    await queueSteps(offer, "made", transaction);
    return { offerId: offer.id, threadId: thread.id, state: offer.state };
  });
}

/** The buyer's or the seller's answer to an offer (404 for anyone else; 409 offer_closed once it is not open). */
export async function answerOffer(
  userId: string,
  offerId: unknown,
  answer: OfferAnswer,
  clock: Clock = systemClock,
): Promise<OfferOutcome> {
  const now = clock.now();
  const outcome = await sequelize.transaction(async (transaction) => {
    const mine = { id: offerId, [Op.or]: [{ buyerId: userId }, { sellerId: userId }] };
    const found = isId(offerId) ? await Offer.findOne({ where: mine, attributes: ["listingId"], transaction }) : null;
    if (!found) throw refusal("not_found", "There is no offer here.");
    // The unit's row first, then offers: accepting one closes the unit's other open offers, so two
    // answers on one unit must take their locks in the same order (or they could deadlock).
    const listing = await Listing.findByPk(found.listingId, { transaction, lock: transaction.LOCK.NO_KEY_UPDATE });
    const offer = listing ? await Offer.findOne({ where: mine, transaction, lock: transaction.LOCK.UPDATE }) : null;
    if (!listing || !offer) throw refusal("not_found", "There is no offer here.");
    const side: OfferParty = offer.buyerId === userId ? "buyer" : "seller";
    if (offer.state === "open" && offer.expiresAt <= now) {
      await offer.update({ state: "expired", decidedAt: now }, { transaction });
      return "expired" as const;
    }
    if (!offerActions(offer, side, now).includes(answer.action)) {
      if (offer.state !== "open") throw refusal("offer_closed", "This offer has already been answered or has expired.");
      throw refusal(
        "forbidden",
        answer.action === "withdraw" ? "Only the side that made an offer can withdraw it." : "You cannot answer your own offer.",
      );
    }
    const thread = offer.threadId
      ? (await threadFor(userId, offer.threadId, { transaction })).thread
      : await openThread(offer.buyerId, offer.listingId, transaction);
    let result: Offer = offer;
    if (answer.action === "accept") {
      if (listing.status !== "live") throw refusal("conflict", "This unit is not for sale at the moment.");
      const { checkoutHours } = await offerTimes(transaction);
      await offer.update(
        { state: "accepted", acceptedAt: now, decidedAt: now, checkoutUntil: new Date(now.getTime() + checkoutHours * HOUR) },
        { transaction },
      );
      await queueSteps(offer, "accepted", transaction);
      await closeOtherOffers(offer, now, transaction);
    } else if (answer.action === "decline" || answer.action === "withdraw") {
      await offer.update({ state: answer.action === "decline" ? "declined" : "withdrawn", decidedAt: now }, { transaction });
      await queueSteps(offer, answer.action === "decline" ? "declined" : "withdrawn", transaction);
    } else {
      if (listing.status !== "live") throw refusal("conflict", "This unit is not for sale at the moment.");
      checkAmount(listing, answer.amountMinor, answer.currency);
      if (answer.amountMinor <= offer.amountMinor)
        throw invalid("amountMinor", "A counter-offer is above the offer it answers; to take this offer, accept it.");
      await offer.update({ state: "countered", decidedAt: now }, { transaction });
      const { offerHours } = await offerTimes(transaction);
      result = await Offer.create(
        {
          listingId: offer.listingId,
          buyerId: offer.buyerId,
          sellerId: offer.sellerId,
          threadId: thread.id,
          amountMinor: answer.amountMinor,
          currency: offer.currency,
          madeBy: side,
          parentOfferId: offer.id,
          expiresAt: new Date(now.getTime() + offerHours * HOUR),
          acceptedAt: null,
          checkoutUntil: null,
          decidedAt: null,
          createdAt: now,
          updatedAt: now,
        },
        { transaction },
      );
      await queueSteps(result, "countered", transaction);
    }
    await touchThread(thread, side, now, transaction);
    return { offerId: result.id, threadId: thread.id, state: result.state };
  });
  // The lapse was saved; the answer itself is refused.
  if (outcome === "expired") throw refusal("offer_closed", "This offer has expired.");
  return outcome;
}

/**
 * One unit, one agreed price: once an offer on it is accepted, the unit's other open offers (other
 * buyers', and the seller's counters to them) close as declined, and each of those buyers is told.
 * An offer already past its time is left to its expiry job, which words it as expired.
 */
async function closeOtherOffers(accepted: Offer, now: Date, transaction: Transaction): Promise<number> {
  const others = await Offer.findAll({
    where: { listingId: accepted.listingId, state: "open", id: { [Op.ne]: accepted.id }, expiresAt: { [Op.gt]: now } },
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  for (const other of others) {
    await other.update({ state: "declined", decidedAt: now }, { transaction });
    await enqueue(QUEUES.offerMail, { offerId: other.id, event: "closed" }, { transaction });
  }
  return others.length;
}

/** The 'offer-expiry' job: an offer still open at its deadline expires (and both sides hear). */
export async function expireOffer(data: unknown, clock: Clock = systemClock): Promise<boolean> {
  const now = clock.now();
  const offerId = (data as { offerId?: unknown } | null)?.offerId;
  if (!isId(offerId)) return false;
  return sequelize.transaction(async (transaction) => {
    const offer = await Offer.findByPk(offerId, { transaction, lock: transaction.LOCK.UPDATE });
    // A minute's grace for the worker's clock running a little behind the database's.
    if (!offer || offer.state !== "open" || offer.expiresAt.getTime() - now.getTime() > EXPIRY_GRACE_MS) return false;
    await offer.update({ state: "expired", decidedAt: now }, { transaction });
    await enqueue(QUEUES.offerMail, { offerId: offer.id, event: "expired" }, { transaction });
    return true;
  });
}
