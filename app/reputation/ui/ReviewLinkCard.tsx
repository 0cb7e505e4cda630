import { Link } from "react-router";
import { ActionCard } from "~/buying/ui/OrderActions";

/** On a completed order's page: the way to the buyer's review (to write it, or for the seller to answer it). */
export function ReviewLinkCard({ orderId, side }: { orderId: string; side: "buyer" | "seller" }) {
  return (
    <ActionCard title={side === "buyer" ? "Rate the seller" : "The buyer's review"} id="review-heading">
      <p className="text-sm text-ink-soft">
        {side === "buyer"
          ? "Once per order: a rating from 1 to 5 and a few words, shown on the seller's page."
          : "When the buyer has rated the sale, you can answer once; your answer shows under the review on your page."}{" "}
        <Link to={`/${side === "buyer" ? "purchases" : "sales"}/${orderId}/review`} className="font-medium">
          {side === "buyer" ? "Rate the seller" : "Read the review"}
        </Link>
      </p>
    </ActionCard>
  );
}
