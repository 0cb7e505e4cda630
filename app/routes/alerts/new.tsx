import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/new";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { canonicalAlertQuery, describeAlertQuery } from "~/alerts/filters";
import { createAlert, NewAlertForm } from "~/alerts/spec-alerts.server";
import { Button } from "~/components/Button";
import { Field, FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { FrequencyChoice } from "~/alerts/ui/FrequencyChoice";

// Save the market's current filters as a spec alert: /alerts/new?<the market's query string>.

export const meta: Route.MetaFunction = () => [{ title: "New spec alert · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  const { query, issues } = canonicalAlertQuery(new URL(request.url).searchParams);
  return { query, words: describeAlertQuery(query), issues };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const parsed = NewAlertForm.safeParse(Object.fromEntries(await readPageForm(request)));
  if (!parsed.success) {
    const fields: Record<string, string> = {};
    for (const i of parsed.error.issues) fields[String(i.path[0] ?? "form")] ??= i.message;
    return data({ fields }, { status: 400 });
  }
  const created = await createAlert(user.id, parsed.data);
  if (!created.ok) return data({ fields: { [created.field]: created.message } }, { status: created.status });
  return redirect(`/alerts?saved=${created.value.id}`);
}

export default function NewAlert({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const fields: Record<string, string> = actionData?.fields ?? {};
  return (
    <main className="mx-auto w-full max-w-2xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Spec alerts"
        title="Save these filters as an alert"
        lede="When a newly published unit matches them, we e-mail you: at once, or in one digest a day."
      />
      <section aria-labelledby="filters" className="space-y-2 rounded-panel border border-rule bg-card p-4">
        <h2 id="filters" className="text-lg">
          The filters
        </h2>
        <ul className="list-disc space-y-1 pl-5 text-ink-soft">
          {loaderData.words.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
        {loaderData.issues.length ? (
          <p className="text-sm text-fault">
            Left out, as the market could not read them: {loaderData.issues.map((i) => i.message).join(" ")}
          </p>
        ) : null}
        <p className="text-sm">
          <Link to={`/market${loaderData.query ? `?${loaderData.query}` : ""}`} className="underline underline-offset-2">
            Back to the market with these filters
          </Link>
        </p>
      </section>
      <Form method="post" className="space-y-5">
        <FormError>{fields.query ?? fields.form}</FormError>
        <input type="hidden" name="query" value={loaderData.query} />
        <Field
          label="Name"
          name="name"
          required
          maxLength={80}
          autoComplete="off"
          error={fields.name}
          hint="So you know it in your inbox."
        />
        <FrequencyChoice name="frequency" value="instant" error={fields.frequency} />
        <Button type="submit" busy={busy}>
          Save the alert
        </Button>
      </Form>
    </main>
  );
}
