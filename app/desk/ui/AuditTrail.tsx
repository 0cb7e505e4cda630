import { Card, CardTitle } from "~/components/Card";
import { momentText } from "@shared/dates";

/** A trail line as audit.server's auditTrail gives it (plain data from a loader). */
export interface AuditTrailLine {
  id: string;
  label: string;
  actor: string;
  at: string;
  note: string;
}

/** A subject's trail for moderators: newest first, who, when, what and their note. */
export function AuditTrail({ items, title = "Trail" }: { items: AuditTrailLine[]; title?: string }) {
  return (
    <Card className="space-y-3" aria-labelledby="audit-trail-title">
      <CardTitle>
        <span id="audit-trail-title">{title}</span>
      </CardTitle>
      {items.length === 0 ? (
        <p className="text-sm text-ink-soft">No moderator has acted on this yet.</p>
      ) : (
        <ol className="divide-y divide-rule" data-testid="audit-trail">
          {items.map((i) => (
            <li key={i.id} className="space-y-1 py-3">
              <p className="text-sm">
                <strong className="font-semibold">{i.label}</strong> · {i.actor}
              </p>
              <p className="whitespace-pre-line text-sm text-ink-soft">{i.note}</p>
              <p className="text-xs text-ink-faint">
                <time className="figures" dateTime={i.at}>
                  {momentText(i.at)}
                </time>
              </p>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
