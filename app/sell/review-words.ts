import type { ListingStatus } from "@shared/catalogue";

// The review step's checklist heading, true to where the listing stands: before publishing it is what
// the market needs; afterwards it is what the listing has, and where it is now.
export function checklistHeading(status: ListingStatus): { title: string; lede?: string } {
  switch (status) {
    case "draft":
      return { title: "Before it goes on the market" };
    case "withdrawn":
      return { title: "Before it goes back on the market", lede: "Withdrawn: buyers no longer see it. Publish again when it is ready." };
    case "held":
      return {
        title: "Published, waiting at the review desk",
        lede: "It reaches the market once a moderator clears it. What it has:",
      };
    case "live":
      return { title: "On the market", lede: "Buyers see it now; changes you save reach the public page. What it has:" };
    case "reserved":
      return { title: "Reserved by a buyer", lede: "Off the market while the buyer pays. What it has:" };
    case "sold":
      return { title: "Sold", lede: "Kept as a record. What it had:" };
    case "removed":
      return { title: "Removed by the review desk", lede: "Kept as a record. What it had:" };
  }
}
