import { Badge, type Tone } from "~/components/Badge";
import { LISTING_STATUS_LABELS, type ListingStatus } from "@shared/catalogue";

const TONE: Record<ListingStatus, Tone> = {
  draft: "neutral",
  held: "brass",
  live: "trace",
  reserved: "brass",
  sold: "walnut",
  withdrawn: "neutral",
  removed: "fault",
};

/** A listing's state in Loadline's words: draft, held for review, live, sold, withdrawn. */
export function StatusBadge({ status, className }: { status: ListingStatus; className?: string }) {
  return (
    <Badge tone={TONE[status]} className={className}>
      {LISTING_STATUS_LABELS[status]}
    </Badge>
  );
}
