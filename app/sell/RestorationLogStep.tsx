import { Form, Link, useNavigation, useSearchParams } from "react-router";
import { PartsList } from "./PartsList";
import { Button, ButtonLink } from "~/components/Button";
import { dayText } from "@shared/dates";
import type { FieldErrors } from "@shared/listing-draft";
import { logValueText, type RestorationEntryView } from "@shared/restoration-form";
import { RestorationEntryForm } from "./RestorationEntryForm";
import { Section } from "./Section";
import { TemplatePicker } from "~/restoration-templates/ui/TemplatePicker";

/** A workshop's restoration templates for the new entry (none offered to a private seller). */
export type EntryTemplates = {
  offered: boolean;
  choices: { id: string; title: string }[];
  chosenId: string | null;
  values: Record<string, string> | null;
};

function Entry({ e, editing }: { e: RestorationEntryView; editing: boolean }) {
  return (
    <article className="space-y-3" aria-label={`Log entry of ${e.doneOn}`}>
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-base">
          <time dateTime={e.doneOn}>{dayText(e.doneOn)}</time>
          {e.technician ? <span className="font-sans text-sm font-normal text-ink-soft"> · {e.technician}</span> : null}
        </h3>
        {editing ? null : (
          <div className="flex gap-1">
            <ButtonLink to={`?edit=${e.id}`} variant="quiet" size="sm">
              Edit
            </ButtonLink>
            <details>
              <summary className="inline-flex h-8 cursor-pointer list-none items-center rounded-md px-3 text-sm font-medium text-fault hover:bg-fault-wash">
                Delete…
              </summary>
              <Form method="post" className="mt-1 flex items-center gap-2 text-sm">
                <input type="hidden" name="intent" value="delete" />
                <input type="hidden" name="entryId" value={e.id} />
                <Button type="submit" name="confirm" value="yes" variant="danger" size="sm">
                  Delete this entry
                </Button>
              </Form>
            </details>
          </div>
        )}
      </header>
      <p className="whitespace-pre-line text-ink">{e.work}</p>
      <PartsList parts={e.parts} />
      {e.readingsBefore.length || e.readingsAfter.length ? (
        <dl className="grid gap-3 text-sm sm:grid-cols-2">
          {(["readingsBefore", "readingsAfter"] as const).map((k) =>
            e[k].length ? (
              <div key={k}>
                <dt className="text-xs font-semibold uppercase tracking-wider text-ink-faint">
                  {k === "readingsBefore" ? "Before" : "After"}
                </dt>
                {e[k].map((r, i) => (
                  <dd key={i}>
                    {r.quantity}: <span className="figures">{logValueText(r)}</span>{" "}
                    <span className="text-ink-faint">({r.conditions})</span>
                  </dd>
                ))}
              </div>
            ) : null,
          )}
        </dl>
      ) : null}
    </article>
  );
}

export type RestorationFailure = {
  intent: string;
  entryId: string;
  values: Record<string, string>;
  errors: FieldErrors;
  formError?: string;
};

/** The restoration step: the log so far, each entry editable, and the form for the next one. */
export function RestorationLogStep({
  listingId,
  restoration,
  failure,
  templates,
}: {
  listingId: string;
  restoration: RestorationEntryView[];
  failure: RestorationFailure | null;
  templates?: EntryTemplates;
}) {
  const listing = { id: listingId };
  const [params] = useSearchParams();
  const added = params.get("added");
  const busy = useNavigation().state === "submitting";
  const editId = params.get("edit");
  const editing = restoration.find((e) => e.id === editId);
  const failed = failure;
  const failedHere = (intent: string, id = "") => (failed && failed.intent === intent && failed.entryId === id ? failed : null);
  return (
    <div className="grid gap-5 lg:grid-cols-[1fr_20rem]">
      <div className="space-y-5">
        <Section
          title="Restoration log"
          lede="Each dated step: what was done, the parts that went in, who did it, and readings before and after where you have them."
        >
          {restoration.length ? (
            <ol className="divide-y divide-rule">
              {restoration.map((e) => (
                <li key={e.id} className="py-4 first:pt-0 last:pb-0">
                  {editing?.id === e.id ? (
                    <RestorationEntryForm
                      entry={e}
                      values={failedHere("update", e.id)?.values}
                      errors={failedHere("update", e.id)?.errors}
                      formError={failedHere("update", e.id)?.formError}
                      busy={busy}
                      cancelHref={`/sell/${listing.id}/restoration`}
                    />
                  ) : (
                    <Entry e={e} editing={!!editing} />
                  )}
                  {failedHere("delete", e.id)?.formError ? (
                    <p className="text-sm text-fault">{failedHere("delete", e.id)?.formError}</p>
                  ) : null}
                </li>
              ))}
            </ol>
          ) : (
            <p className="text-ink-soft">No entries yet. A unit sold as “serviced & measured” needs at least one.</p>
          )}
        </Section>
        {editing ? null : (
          <Section title="Add an entry">
            {added && restoration.some((e) => e.id === added) ? (
              <p role="status" className="text-sm font-medium text-trace">
                Added to the log. The form is ready for the next entry.
              </p>
            ) : null}
            {templates?.offered ? <TemplatePicker choices={templates.choices} chosenId={templates.chosenId} /> : null}
            <RestorationEntryForm
              key={`${added ?? "first"}-${templates?.chosenId ?? "blank"}`}
              focusFirst={!!added && !failedHere("add")}
              values={failedHere("add")?.values ?? templates?.values ?? undefined}
              errors={failedHere("add")?.errors}
              formError={failedHere("add")?.formError}
              busy={busy}
            />
          </Section>
        )}
      </div>
      <aside className="space-y-3 text-sm text-ink-soft lg:pt-1">
        <h2 className="text-base text-ink">What makes a log worth reading</h2>
        <p>Dates and parts with their values and board references, so a later technician can follow the work.</p>
        <p>Readings before and after with how they were taken: “bias 25 mA per device after 30 min, 230 V mains”.</p>
        <p>
          <Link to={`/sell/${listing.id}/photos`}>Next: photos →</Link>
        </p>
      </aside>
    </div>
  );
}
