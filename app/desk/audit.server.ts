import type { Transaction } from "sequelize";
import { AuditRecord, User } from "~/models/index.server";

// The desk's trail: every moderator action writes one append-only row (the database refuses UPDATE
// and DELETE on audit_records), in the same transaction as the change it explains, so a change never
// lands without its reason and a reason never outlives a rolled-back change.

export const DESK_SUBJECT_TYPES = ["listing", "user", "workshop", "order", "review", "flag", "thread"] as const;
export type DeskSubjectType = (typeof DESK_SUBJECT_TYPES)[number];
export type DeskSubject = { type: DeskSubjectType; id: string };

/** What each action reads as on a trail; an action not listed here shows its code with spaces. */
export const AUDIT_ACTION_LABELS: Record<string, string> = {
  clear_hold: "Cleared the hold",
  ask_changes: "Asked for changes",
  remove_listing: "Removed the listing",
  suspend_account: "Suspended the account",
  reinstate_account: "Reinstated the account",
  verify_workshop: "Verified the workshop",
  refuse_workshop: "Refused the workshop",
  dismiss_flag: "Dismissed a flag",
  release_order: "Released the order",
  refund_order: "Refunded the order",
  hide_review: "Hid the review",
};

export function auditActionLabel(action: string): string {
  return AUDIT_ACTION_LABELS[action] ?? action.replace(/_/g, " ");
}

export interface AuditEntry {
  /** Null: the system acted. */
  actorId: string | null;
  /** A short snake_case verb (AUDIT_ACTION_LABELS). */
  action: string;
  subject: DeskSubject;
  /** Why: the moderator's required note. */
  note: string;
  before?: unknown;
  after?: unknown;
}

/** Writes the record; returns its id (a mail about the action is keyed by it). */
export async function recordAudit(e: AuditEntry, transaction: Transaction): Promise<string> {
  if (!/^[a-z][a-z_]*$/.test(e.action)) throw new Error(`audit action must be snake_case: ${e.action}`);
  if (!e.note.trim()) throw new Error("an audit record needs a note");
  const row = await AuditRecord.create(
    {
      actorId: e.actorId,
      action: e.action,
      subjectType: e.subject.type,
      subjectId: e.subject.id,
      note: e.note.trim(),
      before: e.before ?? null,
      after: e.after ?? null,
    },
    { transaction },
  );
  return row.id;
}

/** One trail line, plain data for a loader. */
export interface AuditTrailItem {
  id: string;
  action: string;
  label: string;
  /** The actor's display name, or "Loadline" for the system. */
  actor: string;
  /** ISO time. */
  at: string;
  note: string;
  before: unknown;
  after: unknown;
}

/** A subject's trail, newest first. */
export async function auditTrail(subject: DeskSubject, options: { limit?: number } = {}): Promise<AuditTrailItem[]> {
  const rows = await AuditRecord.findAll({
    where: { subjectType: subject.type, subjectId: subject.id },
    include: [{ model: User, as: "actor", attributes: ["displayName"] }],
    // created_at is the transaction's start; id breaks ties only to keep the order stable.
    order: [
      ["createdAt", "DESC"],
      ["id", "DESC"],
    ],
    limit: options.limit ?? 200,
  });
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    label: auditActionLabel(r.action),
    actor: r.actorId === null ? "Loadline" : (r.actor?.displayName ?? "a former moderator"),
    at: r.createdAt.toISOString(),
    note: r.note,
    before: r.before ?? null,
    after: r.after ?? null,
  }));
}
