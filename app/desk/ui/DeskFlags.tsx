import { Link } from "react-router";
import { Card, CardTitle } from "~/components/Card";
import { Badge } from "~/components/Badge";
import type { FlagView, PairPhoto } from "../flag-view.server";
import type { ActionErrors } from "../listing-actions.server";
import { deskMoment } from "../time";
import { DismissFlagForm } from "./ListingActions";

// A listing's open flags: a copied photo beside the photo it copies, a low price with the index behind
// it, a report with its reason and note; each with its own dismissal.

function Photo({ photo, caption }: { photo: PairPhoto | null; caption: string }) {
  return (
    <figure className="min-w-0 space-y-1">
      {photo?.url ? (
        <img
          src={photo.url}
          alt={`${caption}: ${photo.listingTitle}`}
          className="aspect-[4/3] w-full rounded-md border border-rule object-cover"
        />
      ) : (
        <div className="grid aspect-[4/3] place-items-center rounded-md border border-dashed border-rule text-xs text-ink-faint">
          Photo no longer stored
        </div>
      )}
      <figcaption className="text-xs text-ink-soft">
        <span className="font-semibold text-ink">{caption}</span>
        {photo ? (
          <>
            {" · "}
            <Link to={`/desk/listings/${photo.listingId}`} className="underline decoration-walnut/40 underline-offset-2">
              {photo.listingTitle}
            </Link>{" "}
            by {photo.seller}
          </>
        ) : null}
      </figcaption>
    </figure>
  );
}

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
                  {deskMoment(f.at)}
                </time>
              </span>
            </p>
            {f.note ? <p className="whitespace-pre-line border-l-2 border-walnut/30 pl-3 text-sm text-ink-soft">{f.note}</p> : null}
            {f.pair ? (
              <div className="space-y-2">
                <div className="grid gap-3 sm:grid-cols-2">
                  <Photo photo={f.pair.photo} caption="This listing's photo" />
                  <Photo photo={f.pair.matches} caption="The photo it copies" />
                </div>
                {f.pair.distance !== null ? (
                  <p className="text-xs text-ink-faint">
                    Hash distance <span className="figures">{f.pair.distance}</span> of 64 bits
                  </p>
                ) : null}
              </div>
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
