import { data, Form, Link, redirect, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/restoration";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { addRestorationEntry, deleteRestorationEntry, updateRestorationEntry } from "~/listings/restoration.server";
import { stepFailure } from "~/listings/http.server";
import { Button, ButtonLink } from "~/components/Button";
import { RestorationEntryForm } from "~/sell/RestorationEntryForm";
import { Section } from "~/sell/Section";
import { useEditor } from "./editor";
import { readRestorationForm, logValueText, type RestorationEntryView } from "@shared/restoration-form";
import { templatesForEditor } from "~/restoration-templates/templates.server";
import { TemplatePicker } from "~/restoration-templates/ui/TemplatePicker";

// A workshop's restoration templates: "Use a template" (?template=<id>) fills the new entry's form.
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { templates: await templatesForEditor(user, new URL(request.url).searchParams.get("template")) };
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.editorForm });
  const intent = form.get("intent");
  const entryId = String(form.get("entryId") ?? "");
  const values = Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
  try {
    if (intent === "delete") {
      if (form.get("confirm") !== "yes")
        return data(
          { ok: false as const, intent: "delete", entryId, errors: {}, formError: "Confirm the deletion.", values },
          { status: 400 },
        );
      await deleteRestorationEntry(params.id, user.id, entryId);
      return redirect(`/sell/${params.id}/restoration`);
    }
    const read = readRestorationForm(form);
    if (!read.ok)
      return data(
        { ok: false as const, intent: String(intent), entryId, errors: read.errors, formError: undefined, values },
        { status: 400 },
      );
    if (intent === "update") await updateRestorationEntry(params.id, user.id, entryId, read.value);
    else await addRestorationEntry(params.id, user.id, read.value);
    return redirect(`/sell/${params.id}/restoration`);
  } catch (e) {
    return data({ ...stepFailure(e, {}), intent: String(intent), entryId, values }, { status: 400 });
  }
}

function Entry({ e, editing }: { e: RestorationEntryView; editing: boolean }) {
  return (
    <article className="space-y-3" aria-label={`Log entry of ${e.doneOn}`}>
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-base">
          <time dateTime={e.doneOn}>
            {new Date(`${e.doneOn}T00:00:00Z`).toLocaleDateString("en-GB", {
              day: "numeric",
              month: "long",
              year: "numeric",
              timeZone: "UTC",
            })}
          </time>
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
      {e.parts.length ? (
        <ul className="space-y-0.5 text-sm">
          {e.parts.map((p, i) => (
            <li key={i}>
              <span className="figures">{p.quantity} ×</span> {p.part}
              {p.reference ? <span className="text-ink-faint"> ({p.reference})</span> : null}
            </li>
          ))}
        </ul>
      ) : null}
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

export default function RestorationStep({ actionData, loaderData }: Route.ComponentProps) {
  const { templates } = loaderData;
  const { listing, restoration } = useEditor();
  const [params] = useSearchParams();
  const busy = useNavigation().state === "submitting";
  const editId = params.get("edit");
  const editing = restoration.find((e) => e.id === editId);
  const failed = actionData && !actionData.ok ? actionData : null;
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
            <TemplatePicker choices={templates.choices} chosenId={templates.chosenId} />
            <RestorationEntryForm
              key={templates.chosenId ?? "blank"}
              values={failedHere("add")?.values ?? templates.values ?? undefined}
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
