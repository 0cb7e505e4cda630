import type { Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { refusal } from "~/http/errors.server";
import { Order, OrderEvent } from "~/models/index.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { ORDER_STATE_LABELS, type ActorKind, type OrderState } from "@shared/orders";
import { isId } from "@shared/ids";
import type { Clock } from "./clock.server";

// The one way an order changes: lock its row, check who and what state, apply the change, count the
// version, write the timeline row and queue the mails, all in one transaction. A refusal writes nothing.

export interface Actor {
  id: string | null;
  kind: ActorKind;
}

export type Audience = "buyer" | "seller";

export interface OrderMailJob {
  orderId: string;
  eventId: string;
  to: Audience;
}

export interface StepContext {
  tx: Transaction;
  now: Date;
}

export interface Step {
  actor: Actor;
  /** The side the actor must be (someone else gets the same 404 as a missing order). */
  side?: Audience;
  from: readonly OrderState[];
  to: OrderState;
  /** A further guard, run after the state check: the reason to refuse, or null. */
  refuse?: (order: Order, now: Date) => string | null;
  apply?: (order: Order, ctx: StepContext) => Promise<void>;
  note?: string | null;
  mail: readonly Audience[];
}

export function notFound() {
  return refusal("not_found", "There is no such order.");
}

export function stateRefusal(order: { state: OrderState }, what: string) {
  return refusal("order_state", `This order is ${ORDER_STATE_LABELS[order.state].toLowerCase()}: ${what}`);
}

/** Locks the order for the rest of the transaction; a missing one is a 404. */
export async function lockOrder(orderId: string, tx: Transaction): Promise<Order> {
  if (!isId(orderId)) throw notFound();
  const order = await Order.findByPk(orderId, { transaction: tx, lock: tx.LOCK.UPDATE });
  if (!order) throw notFound();
  return order;
}

/** Records a change in the timeline and queues its mails (to each side named), in `tx`. */
export async function recordEvent(
  order: Order,
  fromState: OrderState | null,
  actor: Actor,
  { note = null, mail, now, tx }: { note?: string | null; mail: readonly Audience[]; now: Date; tx: Transaction },
): Promise<OrderEvent> {
  const event = await OrderEvent.create(
    { orderId: order.id, fromState, toState: order.state, actorId: actor.id, actorKind: actor.kind, note, at: now },
    { transaction: tx },
  );
  for (const to of mail) {
    const job: OrderMailJob = { orderId: order.id, eventId: event.id, to };
    await enqueue(QUEUES.orderMail, job, { transaction: tx, singletonKey: `order-mail:${event.id}:${to}` });
  }
  return event;
}

/** Runs one transition in its own transaction; returns the order as it is after. */
export function runStep(orderId: string, step: Step, clock: Clock): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    const order = await lockOrder(orderId, tx);
    if (step.side && order[`${step.side}Id`] !== step.actor.id) throw notFound();
    if (!step.from.includes(order.state)) throw stateRefusal(order, `it cannot become ${ORDER_STATE_LABELS[step.to].toLowerCase()} now.`);
    const why = step.refuse?.(order, now);
    if (why) throw stateRefusal(order, why);
    const fromState = order.state;
    await step.apply?.(order, { tx, now });
    order.state = step.to;
    order.version += 1;
    await order.save({ transaction: tx });
    await recordEvent(order, fromState, step.actor, { note: step.note, mail: step.mail, now, tx });
    return order;
  });
}
