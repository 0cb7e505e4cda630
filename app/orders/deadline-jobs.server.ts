import type { Transaction } from "sequelize";
import { enqueue, QUEUES } from "~/services/jobs.server";
import type { DeadlineKind } from "@shared/orders";

// Each order deadline is one deferred pg-boss job, written in the transaction that sets the deadline:
// it survives restarts (it is a row), and the handler re-reads the order, so a duplicate, a late run
// or a deadline overtaken by the people involved does nothing.

export interface DeadlineJob {
  orderId: string;
  kind: DeadlineKind;
}

export function scheduleDeadline(orderId: string, kind: DeadlineKind, at: Date, transaction: Transaction): Promise<string> {
  const job: DeadlineJob = { orderId, kind };
  return enqueue(QUEUES.orderDeadline, job, { transaction, startAfter: at, singletonKey: `order:${orderId}:${kind}` });
}
