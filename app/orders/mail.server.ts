import { QueryTypes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing, Order, OrderEvent, User } from "~/models/index.server";
import { appLink, sendNotice } from "~/alerts/mail.server";
import { idSchema } from "@shared/ids";
import { listingTitle, TWO_PERSON_LIFT_G } from "@shared/catalogue";
import { formatPrice } from "@shared/money";
import { nextStep } from "@shared/orders";
import type { Audience } from "./step.server";
import { momentText } from "@shared/dates";

// The 'order-mail' worker: one mail to one side about one timeline row, in the notices' layout. The
// job reads the order as it is when it runs but words the mail from the event it was queued for, so
// a late mail still says what happened. Transactional (about the reader's own order): no unsubscribe.

const OrderMailSchema = z.object({ orderId: idSchema("order"), eventId: idSchema("event"), to: z.enum(["buyer", "seller"]) });

const HEAVY_CAUTION =
  "This unit weighs 30 kg or more: lift it with two people, keep your back straight, and move it on a freight pallet or in packing made for that weight.";
const RECEIVING_CAUTION =
  "Before you measure: let a unit that arrived cold stand at room temperature for a few hours before switching it on, check that its mains voltage matches yours, and test amplifiers into a proper dummy load, never into nothing. Anything inside the case is for a qualified technician; follow your local electrical-safety rules.";

function when(d: Date | null): string {
  return d ? momentText(d) : "";
}

/** Subject and paragraphs for one side, from the event's change. */
function wording(order: Order, event: OrderEvent, to: Audience, title: string, heavy: boolean): { subject: string; paragraphs: string[] } {
  const total = formatPrice(order.totalMinor, order.currency);
  const buyer = to === "buyer";
  switch (event.toState) {
    case "funded":
      if (event.fromState === "reserved")
        return buyer
          ? {
              subject: `Paid: ${title}`,
              paragraphs: [
                `Your payment of ${total} is held by Loadline until you have auditioned the unit. The seller ships by ${when(order.shipBy)}.`,
              ],
            }
          : {
              subject: `Sold, ship by ${when(order.shipBy)}: ${title}`,
              paragraphs: [
                `The buyer has paid ${total}; Loadline holds it until they have auditioned the unit. Ship it and enter the carrier and tracking number by ${when(order.shipBy)}, or the order is cancelled and the buyer refunded.`,
                ...(heavy ? [HEAVY_CAUTION] : []),
              ],
            };
      break;
    case "shipped":
      return buyer
        ? {
            subject: `On its way: ${title}`,
            paragraphs: [
              `The seller shipped it with ${order.carrier}, tracking number ${order.trackingNumber}. Confirm arrival when it reaches you.`,
              ...(heavy ? [HEAVY_CAUTION] : []),
            ],
          }
        : {
            subject: `Shipment recorded: ${title}`,
            paragraphs: [`We told the buyer: ${order.carrier}, tracking number ${order.trackingNumber}.`],
          };
    case "audition":
      return buyer
        ? {
            subject: `Your audition window is open: ${title}`,
            paragraphs: [
              `Try the unit until ${when(order.auditionEndsAt)}. Accept it, or contest with your reasons and, if you can, your own readings. With no action the payment is released to the seller then.`,
              RECEIVING_CAUTION,
            ],
          }
        : {
            subject: `Arrived: ${title}`,
            paragraphs: [
              `The buyer's audition window runs until ${when(order.auditionEndsAt)}. With no contest the payment is released to you then.`,
            ],
          };
    case "contested":
      return buyer
        ? {
            subject: `Contest received: ${title}`,
            paragraphs: ["Your payment stays held. A moderator looks at both sides' evidence and tells you both the decision."],
          }
        : {
            subject: `The buyer contests: ${title}`,
            paragraphs: [
              `Their reason: ${event.note ?? ""}`,
              "A moderator looks at both sides' evidence; the payment stays held until then.",
            ],
          };
    case "released":
      if (event.actorKind === "provider")
        return {
          subject: `Payout sent: ${title}`,
          paragraphs: [
            `${formatPrice(order.totalMinor - (order.feeMinor ?? 0) - order.refundedMinor, order.currency)} is on its way to your payout account.`,
          ],
        };
      return buyer
        ? { subject: `Complete: ${title}`, paragraphs: ["The payment has been released to the seller. Enjoy the unit."] }
        : {
            subject: `Payment released: ${title}`,
            paragraphs: [
              `${formatPrice(order.totalMinor - (order.feeMinor ?? 0), order.currency)} after Loadline's fee of ${formatPrice(order.feeMinor ?? 0, order.currency)} goes to your payout account.`,
            ],
          };
    case "refunded":
      if (event.actorKind === "provider")
        return { subject: `Refund sent: ${title}`, paragraphs: [`${event.note ?? "Your refund is on its way."}`] };
      return {
        subject: `Contest decided: ${title}`,
        paragraphs: [
          buyer ? "A moderator decided your contest." : "A moderator decided the buyer's contest.",
          `Their note: ${event.note ?? ""}`,
        ],
      };
    case "cancelled":
      if (event.actorKind === "provider" && event.note?.startsWith("Refunded"))
        return { subject: `Refund sent: ${title}`, paragraphs: [event.note] };
      return buyer
        ? { subject: `Cancelled: ${title}`, paragraphs: [event.note ?? "The order is cancelled."] }
        : { subject: `Cancelled: ${title}`, paragraphs: [event.note ?? "The order is cancelled."] };
    default:
      break;
  }
  return { subject: `Your order: ${title}`, paragraphs: [event.note ?? "Your order has changed."] };
}

/**
 * The job: one mail to one side about one timeline row, at most once. Its mark (order_mail_marks) is
 * written in the transaction that sends; a second run (a retry after a crash past the send, or a
 * doubled job) waits on the first's mark, finds it, and sends nothing. Returns whether it sent.
 */
export async function deliverOrderMail(data: unknown): Promise<boolean> {
  const job = OrderMailSchema.parse(data);
  const [order, event] = await Promise.all([Order.findByPk(job.orderId), OrderEvent.findByPk(job.eventId)]);
  if (!order || !event || event.orderId !== order.id) return false;
  const [listing, reader] = await Promise.all([
    Listing.findByPk(order.listingId),
    User.findByPk(job.to === "buyer" ? order.buyerId : order.sellerId),
  ]);
  if (!reader) return false;
  return sequelize.transaction(async (transaction) => {
    const [marked] = await sequelize.query(
      `INSERT INTO order_mail_marks (event_id, audience) VALUES ($1, $2) ON CONFLICT DO NOTHING RETURNING event_id`,
      { bind: [event.id, job.to], type: QueryTypes.SELECT, transaction },
    );
    if (!marked) return false;
    // Sent inside the transaction: a failed send rolls the mark back and the job's retry sends again.
    await send(order, event, job.to, listing, reader);
    return true;
  });
}

async function send(order: Order, event: OrderEvent, to: Audience, listing: Listing | null, reader: User): Promise<void> {
  const title = listingTitle(listing?.maker, listing?.model);
  const heavy = (listing?.weightG ?? 0) >= TWO_PERSON_LIFT_G;
  const { subject, paragraphs } = wording(order, event, to, title, heavy);
  const path = to === "buyer" ? `/purchases/${order.id}` : `/sales/${order.id}`;
  await sendNotice({
    to: reader.email,
    subject,
    greeting: `Hello ${reader.displayName},`,
    paragraphs: [...paragraphs, `Next: ${nextStep(order, to).text}`],
    groups: [],
    links: [{ label: to === "buyer" ? "Your purchase" : "Your sale", href: appLink(path) }],
  });
}
