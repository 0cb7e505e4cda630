import { z } from "zod";
import { listingTitle } from "@shared/catalogue";
import { idSchema } from "@shared/ids";
import { formatPrice } from "@shared/money";
import { Listing, User } from "~/models/index.server";
import { Offer } from "~/models/offer.server";
import { sendTalkMail, type TalkMail } from "~/messages/talk-mail.server";
import { momentText } from "@shared/dates";

// The 'offer-mail' job: each step of an offer mailed to the side that needs to know (both sides when
// one is accepted or expires). Written as the offer stands when the job runs.

// "closed": declined because the seller accepted another offer on the unit (to the buyer only).
export const OFFER_MAIL_EVENTS = ["made", "countered", "accepted", "declined", "withdrawn", "expired", "closed"] as const;
export type OfferMailEvent = (typeof OFFER_MAIL_EVENTS)[number];

export const OfferMailJobSchema = z.object({ offerId: idSchema("offer"), event: z.enum(OFFER_MAIL_EVENTS) });

const when = (d: Date) => momentText(d);

/** Sends the step's mails; returns how many went. */
export async function deliverOfferMail(data: unknown): Promise<number> {
  const { offerId, event } = OfferMailJobSchema.parse(data);
  const offer = await Offer.findByPk(offerId);
  if (!offer) return 0;
  const [listing, buyer, seller] = await Promise.all([
    Listing.findByPk(offer.listingId, { attributes: ["id", "maker", "model", "priceMinor", "currency"] }),
    User.findByPk(offer.buyerId, { attributes: ["email", "displayName", "status"] }),
    User.findByPk(offer.sellerId, { attributes: ["email", "displayName", "status"] }),
  ]);
  if (!listing || !buyer || !seller) return 0;
  const title = listingTitle(listing.maker, listing.model);
  const amount = formatPrice(offer.amountMinor, offer.currency);
  const path = offer.threadId ? `/messages/${offer.threadId}` : `/listings/${listing.id}`;
  const byBuyer = offer.madeBy === "buyer";
  const maker = byBuyer ? buyer : seller;
  const other = byBuyer ? seller : buyer;
  const mails: { to: typeof buyer; subject: string; paragraphs: string[]; label: string }[] = [];
  switch (event) {
    case "made":
      mails.push({
        to: seller,
        subject: `An offer of ${amount} for the ${title}`,
        paragraphs: [
          `${buyer.displayName} offers ${amount} for the ${title}. The offer is open until ${when(offer.expiresAt)}: accept it, decline it or make a counter-offer.`,
        ],
        label: "Answer the offer",
      });
      break;
    case "countered":
      mails.push({
        to: other,
        subject: `A counter-offer of ${amount} for the ${title}`,
        paragraphs: [`${maker.displayName} answers your offer with ${amount} for the ${title}. It is open until ${when(offer.expiresAt)}.`],
        label: "See the counter-offer",
      });
      break;
    case "accepted": {
      const until = offer.checkoutUntil ? when(offer.checkoutUntil) : "the end of the checkout window";
      mails.push({
        to: buyer,
        subject: `Offer accepted: the ${title} at ${amount}`,
        paragraphs: [
          `The offer of ${amount} for the ${title} is accepted. You can buy it at that price until ${until}; after that the asking price applies again.`,
        ],
        label: "Buy at this price",
      });
      mails.push({
        to: seller,
        subject: `Offer accepted: the ${title} at ${amount}`,
        paragraphs: [`The offer of ${amount} for the ${title} is accepted. ${buyer.displayName} can buy it at that price until ${until}.`],
        label: "Open the conversation",
      });
      break;
    }
    case "declined":
      mails.push({
        to: maker,
        subject: `Offer declined: the ${title}`,
        paragraphs: [`${other.displayName} declined the offer of ${amount} for the ${title}.`],
        label: "Open the conversation",
      });
      break;
    case "withdrawn":
      mails.push({
        to: other,
        subject: `Offer withdrawn: the ${title}`,
        paragraphs: [`${maker.displayName} withdrew the offer of ${amount} for the ${title}.`],
        label: "Open the conversation",
      });
      break;
    case "closed":
      mails.push({
        to: buyer,
        subject: `Offer closed: the ${title}`,
        paragraphs: [
          `${seller.displayName} accepted another offer for the ${title}, so the offer of ${amount} between you is closed. If that sale does not go ahead, the unit returns to the market and you may offer again.`,
        ],
        label: "Open the conversation",
      });
      break;
    case "expired":
      for (const to of [maker, other]) {
        mails.push({
          to,
          subject: `Offer expired: the ${title}`,
          paragraphs: [`The offer of ${amount} for the ${title} was not answered in time and has expired.`],
          label: "Open the conversation",
        });
      }
      break;
  }
  let sent = 0;
  for (const m of mails) {
    if (m.to.status !== "active") continue;
    const mail: TalkMail = {
      to: m.to.email,
      subject: m.subject,
      greeting: `Hello ${m.to.displayName},`,
      paragraphs: m.paragraphs,
      link: { label: m.label, path },
    };
    await sendTalkMail(mail);
    sent++;
  }
  return sent;
}
