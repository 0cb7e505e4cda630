import { Link } from "react-router";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { CAPTURE_ADD_FORM_ID, type PostedCaptureView } from "./capture-kinds";
/** The capture the plain form posted, as the server left it: its readings, or why it was refused. */
export function PostedCapture({ posted, listingId }: { posted: PostedCaptureView; listingId?: string }) {
  const waiting = posted.status === "queued" || posted.status === "running";
  return (
    <div
      className="space-y-1.5 rounded-md border border-rule bg-card p-3 text-sm"
      data-capture-state={posted.status}
      data-testid="posted-capture"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="truncate font-medium">{posted.fileName}</span>
        <Badge tone={posted.status === "done" ? "trace" : posted.status === "failed" ? "fault" : "brass"}>
          {posted.status === "done" ? "Analysed" : posted.status === "failed" ? "Refused" : "Analysing"}
        </Badge>
      </div>
      {posted.message ? (
        <p role="alert" className="text-fault">
          {posted.message}
        </p>
      ) : null}
      {posted.readings.length || posted.sweepPoints ? (
        <ul className="text-xs text-ink-soft" aria-label="Readings from this capture">
          {posted.readings.map((r, n) => (
            <li key={n}>{r}</li>
          ))}
          {posted.sweepPoints ? <li>Response sweep with {posted.sweepPoints} points</li> : null}
        </ul>
      ) : null}
      {posted.status === "done" ? (
        posted.onSheet ? (
          <p className="text-xs text-trace">Its readings are on the sheet below, marked as from a capture.</p>
        ) : (
          <Button variant="secondary" size="sm" type="submit" form={CAPTURE_ADD_FORM_ID}>
            Add its readings to the sheet
          </Button>
        )
      ) : null}
      {waiting && listingId ? (
        <p className="text-xs text-ink-soft">
          Still analysing.{" "}
          <Link to={`/sell/${listingId}/bench?capture=${posted.id}#captures`} reloadDocument>
            Check again
          </Link>{" "}
          in a moment.
        </p>
      ) : null}
    </div>
  );
}
