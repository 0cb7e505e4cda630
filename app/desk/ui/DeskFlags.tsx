import { Card, CardTitle } from "~/components/Card";
import { Badge } from "~/components/Badge";
import type { FlagView } from "../flag-view.server";
import { CopiedPhotoPair } from "./CopiedPhotoPair";
import type { ActionErrors } from "../listing-actions.server";
import { momentText } from "@shared/dates";
import { DismissFlagForm } from "./ListingActions";

// A listing's open flags: a copied photo beside the photo it copies, a low price with the index behind
// it, a report with its reason and note; each with its own dismissal.

export function DeskFlags({
  flags,
  disabled,
  errors,
  values,
}: {
  flags: FlagView[];
  disabled: boolean;
  errors: ActionErrors;
  values: { intent?: string; note?: string; flagId?: string };
}) {
  if (!flags.length) return null;
  return (
    <Card className="space-y-4" aria-labelledby="desk-flags">
      <CardTitle>
        <span id="desk-flags">Open flags</span> <span className="figures text-sm text-ink-soft">{flags.length}</span>
      </CardTitle>
      <ul className="space-y-5">
        {flags.map((f) => (
          <li key={f.id} className="space-y-3" data-testid={`flag-${f.kind}`}>
            <p className="flex flex-wrap items-center gap-2 text-sm">
              <Badge tone={f.kind === "report" ? "fault" : "brass"}>{f.heading}</Badge>
              <span className="font-semibold">{f.reason}</span>
              <span className="text-xs text-ink-faint">
                {f.reporter ? `by ${f.reporter} · ` : ""}
                <time className="figures" dateTime={f.at}>
                  {momentText(f.at)}
                </time>
              </span>
            </p>
            {f.note ? <p className="whitespace-pre-line border-l-2 border-walnut/30 pl-3 text-sm text-ink-soft">{f.note}</p> : null}
            {f.pair ? (
              <CopiedPhotoPair pair={f.pair} />
            ) : f.kind === "copied_photo" ? (
              <p className="text-sm text-ink-soft">One of the two photos is no longer stored.</p>
            ) : null}
            {f.facts.length ? (
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
                {f.facts.map((x) => (
                  <div key={x.label} className="contents">
                    <dt className="text-ink-soft">{x.label}</dt>
                    <dd className="figures">{x.value}</dd>
                  </div>
                ))}
              </dl>
            ) : null}
            <DismissFlagForm flagId={f.id} disabled={disabled} errors={errors} values={values} />
          </li>
        ))}
      </ul>
    </Card>
  );
}
