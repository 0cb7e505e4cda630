import type { Listing } from "~/models/index.server";
import { formatPrice, listingTitle } from "@shared/catalogue";
import { appLink, sendNotice, type NoticeUnit } from "./mail.server";
import { issueUnsubscribeUrl } from "./unsubscribe.server";

// The spec-alert mail: at once, one alert and one listing; the digest, every alert with its new
// listings. A single alert's mail unsubscribes from that alert; a digest's from all of them.

export interface AlertHit {
  alertId: string;
  alertName: string;
  query: string;
  listing: Pick<Listing, "id" | "maker" | "model" | "priceMinor" | "currency" | "town" | "country" | "benchVerified">;
}

export interface Recipient {
  id: string;
  email: string;
  displayName: string;
}

function unit(listing: AlertHit["listing"]): NoticeUnit {
  const price = listing.priceMinor === null ? null : formatPrice(listing.priceMinor, listing.currency);
  const place = [listing.town, listing.country].filter(Boolean).join(", ");
  return {
    title: listingTitle(listing.maker, listing.model),
    href: appLink(`/listings/${listing.id}`),
    detail: [price, place, listing.benchVerified ? "bench-verified" : null].filter(Boolean).join(" · "),
  };
}

export async function mailAlertHits(to: Recipient, hits: AlertHit[], now = new Date()): Promise<void> {
  const alerts = new Map<string, AlertHit[]>();
  for (const h of hits) alerts.set(h.alertId, [...(alerts.get(h.alertId) ?? []), h]);
  const single = alerts.size === 1 ? hits[0] : null;
  const count = hits.length;
  const subject = single
    ? count === 1
      ? `New for your alert “${single.alertName}”: ${unit(single.listing).title}`
      : `${count} new units for your alert “${single.alertName}”`
    : `Your spec alerts today: ${count} new unit${count === 1 ? "" : "s"}`;
  await sendNotice({
    to: to.email,
    subject,
    greeting: `Hello ${to.displayName},`,
    paragraphs: [
      single
        ? `A newly published unit matches your spec alert “${single.alertName}”.`
        : `Newly published units match ${alerts.size} of your spec alerts.`,
    ],
    groups: [...alerts.values()].map((group) => ({
      heading: single ? undefined : `${group[0].alertName}`,
      units: group.map((h) => unit(h.listing)),
    })),
    links: [
      ...(single ? [{ label: "All matches in the market", href: appLink(`/market${single.query ? `?${single.query}` : ""}`) }] : []),
      { label: "Your spec alerts", href: appLink("/alerts") },
      { label: "Your watch list", href: appLink("/watching") },
    ],
    unsubscribe: single
      ? {
          href: await issueUnsubscribeUrl(to.id, { kind: "alert", alertId: single.alertId }, now),
          what: `You get this because you saved the spec alert “${single.alertName}” on Loadline. To stop it:`,
        }
      : {
          href: await issueUnsubscribeUrl(to.id, { kind: "alerts" }, now),
          what: "You get this daily digest because you saved spec alerts on Loadline. To stop every alert's mail:",
        },
  });
}
