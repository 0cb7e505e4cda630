import { UniqueConstraintError, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { HttpError, refusal } from "~/http/errors.server";
import { Listing, Order, Review, User } from "~/models/index.server";
import { lockOrder, notFound } from "~/orders/step.server";
import type { Clock } from "~/orders/clock.server";
import { recordAudit } from "~/desk/audit.server";
import { appLink, sendNotice } from "~/alerts/mail.server";
import { listingTitle } from "@shared/catalogue";
import { isId } from "@shared/ids";
import { AnswerForm, HideForm, ReviewForm, readFields, type FieldErrors } from "./review-form";

// Reviews: the buyer of a released order rates the seller once; the seller answers once; a moderator
// hides an abusive one with a note, written to the audit trail in the same transaction. Someone else's
// order is the same 404 as a missing one. A second review or answer is refused (409 already_done),
// decided under the order's (or the review's) row lock so two tabs cannot both write.

export type FormResult = { ok: true } | { ok: false; status: number; errors: FieldErrors };

/** A review as its pages show it. */
export interface ReviewView {
  id: string;
  rating: number;
  body: string;
  answer: string | null;
  createdAt: string;
  answeredAt: string | null;
  hidden: { at: string; note: string } | null;
}

export interface ReviewPage {
  order: { id: string; title: string; state: string; released: boolean; sellerName: string; buyerName: string };
  review: ReviewView | null;
}

export function reviewView(r: Review): ReviewView {
  return {
    id: r.id,
    rating: r.rating,
    body: r.body,
    answer: r.answer ?? null,
    createdAt: r.createdAt.toISOString(),
    answeredAt: r.answeredAt ? r.answeredAt.toISOString() : null,
    hidden: r.hiddenAt && r.hiddenNote ? { at: r.hiddenAt.toISOString(), note: r.hiddenNote } : null,
  };
}

/** The order as one side sees it for its review (the other side and strangers get a 404). */
export async function reviewPage(userId: string, orderId: string, side: "buyer" | "seller"): Promise<ReviewPage> {
  if (!isId(orderId)) throw notFound();
  const order = await Order.findByPk(orderId);
  if (!order || order[`${side}Id`] !== userId) throw notFound();
  const [listing, seller, buyer] = await Promise.all([
    Listing.findByPk(order.listingId, { attributes: ["id", "maker", "model"] }),
    User.findByPk(order.sellerId, { attributes: ["id", "displayName"] }),
    User.findByPk(order.buyerId, { attributes: ["id", "displayName"] }),
  ]);
  const review = await Review.findOne({ where: { orderId: order.id } });
  return {
    order: {
      id: order.id,
      title: listingTitle(listing?.maker, listing?.model),
      state: order.state,
      released: order.releasedAt !== null,
      sellerName: seller?.displayName ?? "the seller",
      buyerName: buyer?.displayName ?? "the buyer",
    },
    // A hidden review stays visible to its two sides, with the moderator's note.
    review: review ? reviewView(review) : null,
  };
}

/** Money released to the seller (in whole, or what was left after a part refund): the sale happened. */
const completed = (order: Order) => order.releasedAt !== null;

export async function writeReview(buyerId: string, orderId: string, fields: Record<string, unknown>, clock: Clock): Promise<FormResult> {
  const read = readFields(ReviewForm, fields);
  if (!read.ok) return { ok: false, status: 400, errors: read.errors };
  return refusedAsForm(() =>
    sequelize.transaction(async (tx) => {
      const order = await lockOrder(orderId, tx);
      if (order.buyerId !== buyerId) throw notFound();
      if (!completed(order)) throw refusal("order_state", "You can rate the seller once the money has been released to them.");
      if (await Review.findOne({ where: { orderId: order.id }, transaction: tx }))
        throw refusal("already_done", "You have already rated the seller for this order.");
      const now = clock.now();
      await Review.create(
        {
          orderId: order.id,
          sellerId: order.sellerId,
          buyerId,
          rating: read.value.rating,
          body: read.value.body,
          createdAt: now,
          updatedAt: now,
        },
        { transaction: tx },
      );
    }),
  );
}

export async function answerReview(sellerId: string, orderId: string, fields: Record<string, unknown>, clock: Clock): Promise<FormResult> {
  const read = readFields(AnswerForm, fields);
  if (!read.ok) return { ok: false, status: 400, errors: read.errors };
  return refusedAsForm(() =>
    sequelize.transaction(async (tx) => {
      if (!isId(orderId)) throw notFound();
      const review = await Review.findOne({ where: { orderId }, transaction: tx, lock: tx.LOCK.UPDATE });
      if (!review) {
        const order = await Order.findByPk(orderId, { attributes: ["id", "sellerId"], transaction: tx });
        if (!order || order.sellerId !== sellerId) throw notFound();
        throw refusal("order_state", "The buyer has not rated this sale yet.");
      }
      if (review.sellerId !== sellerId) throw notFound();
      if (review.answer !== null) throw refusal("already_done", "You have already answered this review.");
      const now = clock.now();
      await review.update({ answer: read.value.answer, answeredAt: now, updatedAt: now }, { transaction: tx });
    }),
  );
}

/** A moderator hides an abusive review; the note goes to the audit trail with the review as it was, and to its writer. */
export async function hideReview(
  moderatorId: string,
  reviewId: string,
  fields: Record<string, unknown>,
  clock: Clock,
): Promise<FormResult> {
  const read = readFields(HideForm, fields);
  if (!read.ok) return { ok: false, status: 400, errors: read.errors };
  const out: { hidden?: Review } = {};
  const done = await refusedAsForm(() =>
    sequelize.transaction(async (tx) => {
      const review = await lockReview(reviewId, tx);
      if (review.hiddenAt) throw refusal("already_done", "This review is already hidden.");
      const now = clock.now();
      const before = { hidden: false, rating: review.rating, body: review.body };
      await review.update({ hiddenAt: now, hiddenBy: moderatorId, hiddenNote: read.value.note, updatedAt: now }, { transaction: tx });
      await recordAudit(
        {
          actorId: moderatorId,
          action: "hide_review",
          subject: { type: "review", id: review.id },
          note: read.value.note,
          before,
          after: { hidden: true },
        },
        tx,
      );
      out.hidden = review;
    }),
  );
  if (done.ok && out.hidden)
    await tellTheWriter(out.hidden).catch((e: unknown) => console.error("[reviews] the hidden-review mail failed", e));
  return done;
}

/** The buyer hears that their review was hidden, and why (after the change is committed; a lost mail changes nothing). */
async function tellTheWriter(review: Review): Promise<void> {
  const buyer = await User.findByPk(review.buyerId, { attributes: ["email", "displayName"] });
  if (!buyer) return;
  await sendNotice({
    to: buyer.email,
    subject: "Your review was hidden by the review desk",
    greeting: `Hello ${buyer.displayName},`,
    paragraphs: [
      "A moderator has hidden your review of a seller on Loadline, so it no longer shows on the seller's page or counts in their rating.",
      `The moderator's note: ${review.hiddenNote ?? ""}`,
    ],
    groups: [],
    links: [{ label: "Your review", href: appLink(`/purchases/${review.orderId}/review`) }],
  });
}

async function lockReview(reviewId: string, tx: Transaction): Promise<Review> {
  const review = isId(reviewId) ? await Review.findByPk(reviewId, { transaction: tx, lock: tx.LOCK.UPDATE }) : null;
  if (!review) throw refusal("not_found", "There is no such review.");
  return review;
}

/** A refusal short of a 404 reads as the form's error; a 404 stays a 404 (the page's error boundary). */
async function refusedAsForm(run: () => Promise<unknown>): Promise<FormResult> {
  try {
    await run();
    return { ok: true };
  } catch (e) {
    if (e instanceof UniqueConstraintError) return { ok: false, status: 409, errors: { form: "This order has already been rated." } };
    if (e instanceof HttpError && e.status !== 404 && e.status < 500) return { ok: false, status: e.status, errors: { form: e.message } };
    throw e;
  }
}
