import { data, Form, redirect, useNavigation, useSearchParams } from "react-router";
import { PartsList } from "~/sell/PartsList";
import type { Route } from "./+types/templates";
import { requireRole } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { redirectWithNotice } from "~/auth/session.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { HttpError, pageError } from "~/http/errors.server";
import { issuesToForm } from "~/listings/http.server";
import { createTemplate, deleteTemplate, listTemplates, updateTemplate } from "~/restoration-templates/templates.server";
import { TemplateForm } from "~/restoration-templates/ui/TemplateForm";
import { Button, ButtonLink } from "~/components/Button";
import { PageHeader } from "~/components/PageHeader";
import { Section } from "~/sell/Section";
import { readTemplateForm, type RestorationTemplateView } from "@shared/restoration-template";

// A workshop's restoration templates: common service jobs saved once and applied to a unit's
// restoration log from the editor ("Use a template"). Workshops only; each sees its own.

export const meta: Route.MetaFunction = () => [{ title: "Restoration templates · Sell · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireRole(request, "workshop");
  return { templates: await listTemplates(user.id) };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireRole(request, "workshop");
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.editorForm });
  const intent = String(form.get("intent") ?? "");
  const templateId = String(form.get("templateId") ?? "");
  const values = Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
  const fail = (errors: Record<string, string>, formError?: string) =>
    data({ ok: false as const, intent, templateId, errors, formError, values }, { status: 400 });
  try {
    if (intent === "delete") {
      await deleteTemplate(user.id, templateId);
      return redirectWithNotice(request, "/sell/templates", "The template is deleted. Log entries made from it stay as they are.");
    }
    if (intent !== "add" && intent !== "update") return fail({}, "Unknown request.");
    const read = readTemplateForm(form);
    if (!read.ok) return fail(read.errors);
    if (intent === "update") await updateTemplate(user.id, templateId, read.value);
    else await createTemplate(user.id, read.value);
    return redirect("/sell/templates");
  } catch (e) {
    if (e instanceof HttpError && e.status !== 404) return fail(issuesToForm(e.issues ?? [], {}), e.issues?.length ? undefined : e.message);
    pageError(e);
  }
}

function TemplateCard({ t, busy }: { t: RestorationTemplateView; busy: boolean }) {
  return (
    <article className="space-y-2" aria-label={t.title}>
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-base">{t.title}</h3>
        <div className="flex gap-1">
          <ButtonLink to={`?edit=${t.id}`} variant="quiet" size="sm">
            Edit
          </ButtonLink>
          <details>
            <summary className="inline-flex h-8 cursor-pointer list-none items-center rounded-md px-3 text-sm font-medium text-fault hover:bg-fault-wash">
              Delete…
            </summary>
            <Form method="post" className="mt-1">
              <input type="hidden" name="intent" value="delete" />
              <input type="hidden" name="templateId" value={t.id} />
              <Button type="submit" variant="danger" size="sm" busy={busy}>
                Delete this template
              </Button>
            </Form>
          </details>
        </div>
      </header>
      <p className="whitespace-pre-line text-sm text-ink">{t.work}</p>
      <PartsList parts={t.parts} className="text-ink-soft" />
    </article>
  );
}

export default function Templates({ loaderData, actionData }: Route.ComponentProps) {
  const { templates } = loaderData;
  const [params] = useSearchParams();
  const busy = useNavigation().state === "submitting";
  const editing = templates.find((t) => t.id === params.get("edit"));
  const failed = actionData && !actionData.ok ? actionData : null;
  const failedFor = (intent: string, id = "") => (failed && failed.intent === intent && failed.templateId === id ? failed : null);
  const addFailed = failedFor("add");
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell"
        title="Restoration templates"
        lede="The service jobs you do again and again, with their parts. In a unit's restoration log, “Use a template” fills a new entry with one; you add the date, who did it and the readings."
        actions={
          <ButtonLink to="/sell" variant="secondary">
            Your listings
          </ButtonLink>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[1fr_1fr]">
        <Section title={`Your templates (${templates.length})`}>
          {templates.length ? (
            <ol className="divide-y divide-rule">
              {templates.map((t) => (
                <li key={t.id} className="py-4 first:pt-0 last:pb-0">
                  {editing?.id === t.id ? (
                    <TemplateForm
                      template={t}
                      values={failedFor("update", t.id)?.values}
                      errors={failedFor("update", t.id)?.errors}
                      formError={failedFor("update", t.id)?.formError}
                      busy={busy}
                      cancelHref="/sell/templates"
                    />
                  ) : (
                    <TemplateCard t={t} busy={busy} />
                  )}
                </li>
              ))}
            </ol>
          ) : (
            <p className="text-ink-soft">No templates yet. Save the first one with the form.</p>
          )}
        </Section>
        {editing ? null : (
          <Section title="New template" lede="A title, the work as the log should read, and the parts that go in.">
            <TemplateForm values={addFailed?.values} errors={addFailed?.errors} formError={addFailed?.formError} busy={busy} />
          </Section>
        )}
      </div>
    </main>
  );
}
