import { z } from "zod";
import { HttpError } from "~/http/errors.server";
import { Order } from "~/models/index.server";
import { idSchema } from "@shared/ids";
import { DEADLINE_KINDS, type DeadlineKind } from "@shared/orders";
import { systemClock, type Clock } from "./clock.server";
import { scheduleDeadline } from "./deadline-jobs.server";
import { sequelize } from "~/db.server";
import { assumeArrival, cancelUnshipped, closeAudition, lapseReservation } from "./transitions.server";
import { marketplaceSettings } from "./settings.server";

// The 'order-deadline' worker: re-reads the order and takes the deadline's step only if it still
// applies. A duplicate or late job, or one whose order moved on, does nothing; one that fires early
// (a clock ahead of the database's) queues itself again for the deadline.

const DeadlineJobSchema = z.object({ orderId: idSchema("order"), kind: z.enum(DEADLINE_KINDS) });

const DAY = 86_400_000;

type Outcome = "done" | "not_due" | "moved_on";

interface Rule {
  state: Order["state"];
  due: (order: Order) => Promise<Date | null>;
  step: (orderId: string, clock: Clock) => Promise<Order>;
}

const RULES: Record<DeadlineKind, Rule> = {
  reservation: { state: "reserved", due: async (o) => o.reservedUntil, step: lapseReservation },
  ship_by: { state: "funded", due: async (o) => o.shipBy, step: cancelUnshipped },
  arrival: {
    state: "shipped",
    due: async (o) => (o.shippedAt ? new Date(o.shippedAt.getTime() + (await marketplaceSettings()).arrivalAssumedDays * DAY) : null),
    step: assumeArrival,
  },
  audition: { state: "audition", due: async (o) => o.auditionEndsAt, step: closeAudition },
};

export async function runDeadline(data: unknown, clock: Clock = systemClock): Promise<Outcome> {
  const job = DeadlineJobSchema.parse(data);
  const rule = RULES[job.kind];
  const order = await Order.findByPk(job.orderId);
  if (!order || order.state !== rule.state) return "moved_on";
  const due = await rule.due(order);
  if (!due) return "moved_on";
  if (clock.now() < due) {
    await sequelize.transaction((tx) => scheduleDeadline(order.id, job.kind, due, tx));
    return "not_due";
  }
  try {
    await rule.step(order.id, clock);
    return "done";
  } catch (error) {
    // Another worker (or the buyer or seller) got there first between our read and the lock.
    if (error instanceof HttpError && error.code === "order_state") return "moved_on";
    throw error;
  }
}

/** The worker's handler (pg-boss passes the job's data). */
export function orderDeadlineJob(data: unknown): Promise<Outcome> {
  return runDeadline(data);
}
