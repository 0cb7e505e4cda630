import { Listing, Order, Review, User, Workshop } from "~/models/index.server";
import { refusal } from "~/http/errors.server";
import { auditTrail, type AuditTrailItem } from "~/desk/audit.server";
import { listingTitle } from "@shared/catalogue";
import { isId } from "@shared/ids";
import { reviewView, type ReviewView } from "./reviews.server";
import { sellerHref } from "./profile.server";

// /desk/reviews/:id: one review as a moderator weighs it: the text, who wrote it about whom, the
// order it came from, and its trail.

export interface DeskReviewPage {
  review: ReviewView;
  buyer: { id: string; name: string };
  seller: { id: string; name: string; href: string };
  order: { id: string; title: string };
  trail: AuditTrailItem[];
}

export async function deskReviewPage(reviewId: string): Promise<DeskReviewPage> {
  const review = isId(reviewId) ? await Review.findByPk(reviewId) : null;
  if (!review) throw refusal("not_found", "There is no such review.");
  const order = await Order.findByPk(review.orderId, { attributes: ["id", "listingId"], rejectOnEmpty: true });
  const [listing, buyer, seller, workshop, trail] = await Promise.all([
    Listing.findByPk(order.listingId, { attributes: ["id", "maker", "model"] }),
    User.findByPk(review.buyerId, { attributes: ["id", "displayName"] }),
    User.findByPk(review.sellerId, { attributes: ["id", "displayName"] }),
    Workshop.findOne({ where: { ownerId: review.sellerId }, attributes: ["slug", "verificationStatus"] }),
    auditTrail({ type: "review", id: review.id }),
  ]);
  return {
    review: reviewView(review),
    buyer: { id: review.buyerId, name: buyer?.displayName ?? "A buyer" },
    seller: { id: review.sellerId, name: seller?.displayName ?? "A seller", href: sellerHref(review.sellerId, workshop) },
    order: { id: order.id, title: listingTitle(listing?.maker, listing?.model) },
    trail,
  };
}
