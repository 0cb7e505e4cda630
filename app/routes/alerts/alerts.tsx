import { data, Form, isRouteErrorResponse, Link, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/alerts";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { describeAlertQuery } from "~/alerts/filters";
import { AlertFrequencyInput, AlertName, changeAlert, listAlerts } from "~/alerts/spec-alerts.server";
import { FREQUENCY_LABELS, FrequencyChoice } from "~/alerts/ui/FrequencyChoice";
import type { AlertFrequency } from "~/alerts/frequency";
import { Button, ButtonLink } from "~/components/Button";
import { ErrorPage } from "~/components/ErrorPage";
import { Field } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { idSchema } from "@shared/ids";

// The buyer's spec alerts: rename, change how often, delete. Plain forms, one per change, so the page
// works without JavaScript; someone else's alert id answers 404.

export const meta: Route.MetaFunction = () => [{ title: "Spec alerts · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const alerts = await listAlerts(user.id);
  const saved = new URL(request.url).searchParams.get("saved");
  return data(
    {
      saved: alerts.some((a) => a.id === saved) ? saved : null,
      alerts: alerts.map((a) => ({ id: a.id, name: a.name, query: a.query, frequency: a.frequency, words: describeAlertQuery(a.query) })),
    },
    { headers: { "Cache-Control": "private, no-store" } },
  );
}

const ChangeForm = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("rename"), alertId: idSchema("alert"), name: AlertName }),
  z.object({ intent: z.literal("frequency"), alertId: idSchema("alert"), frequency: AlertFrequencyInput }),
  z.object({ intent: z.literal("delete"), alertId: idSchema("alert") }),
]);

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = Object.fromEntries(await readPageForm(request));
  const parsed = ChangeForm.safeParse(form);
  const alertId = typeof form.alertId === "string" ? form.alertId : null;
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = String(issue.path[0] ?? "intent");
    const message = field === "intent" ? "Choose rename, frequency or delete." : issue.message;
    return data({ alertId, field, message }, { status: 400 });
  }
  const change =
    parsed.data.intent === "rename"
      ? { name: parsed.data.name }
      : parsed.data.intent === "frequency"
        ? { frequency: parsed.data.frequency }
        : { delete: true as const };
  const result = await changeAlert(user.id, parsed.data.alertId, change);
  if (!result.ok) return data({ alertId, field: result.field, message: result.message }, { status: result.status });
  return { alertId, done: parsed.data.intent };
}

const DONE: Record<string, string> = { rename: "Renamed.", frequency: "Saved.", delete: "Alert deleted." };

export default function Alerts({ loaderData, actionData }: Route.ComponentProps) {
  const { alerts, saved } = loaderData;
  const failed = actionData && "message" in actionData ? actionData : null;
  const done = actionData && "done" in actionData ? actionData : null;
  return (
    <main className="mx-auto w-full max-w-3xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Keeping track"
        title="Spec alerts"
        lede="Saved market filters: when a newly published unit matches one, we e-mail you."
        actions={
          <ButtonLink to="/market" variant="secondary">
            Find units to alert on
          </ButtonLink>
        }
      />
      <div aria-live="polite">
        {saved ? <p className="rounded-md border border-rule bg-sunk px-3 py-2 text-sm">Alert saved.</p> : null}
        {done?.done === "delete" ? <p className="rounded-md border border-rule bg-sunk px-3 py-2 text-sm">{DONE.delete}</p> : null}
        {failed && !alerts.some((a) => a.id === failed.alertId) ? (
          <p role="alert" className="rounded-md border border-fault/40 bg-fault-wash px-3 py-2 text-sm text-fault">
            {failed.message}
          </p>
        ) : null}
      </div>
      {alerts.length ? (
        <ul className="space-y-5">
          {alerts.map((a) => (
            <AlertItem
              key={a.id}
              alert={a}
              error={failed?.alertId === a.id ? failed : null}
              done={done?.alertId === a.id ? (DONE[done.done] ?? null) : null}
            />
          ))}
        </ul>
      ) : (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">No spec alerts yet</h2>
          <p className="mx-auto mt-2 max-w-md text-ink-soft">
            Set the market&apos;s filters to what you are after, then choose{" "}
            <span className="font-medium text-ink">Save these filters as an alert</span>.
          </p>
        </div>
      )}
    </main>
  );
}

interface AlertView {
  id: string;
  name: string;
  query: string;
  frequency: AlertFrequency;
  words: string[];
}

function AlertItem({ alert, error, done }: { alert: AlertView; error: { field: string; message: string } | null; done: string | null }) {
  const busy = useNavigation().state === "submitting";
  const headingId = `alert-${alert.id}`;
  return (
    <li aria-labelledby={headingId} className="space-y-4 rounded-panel border border-rule bg-card p-4 shadow-panel sm:p-5">
      <div className="space-y-1">
        <h2 id={headingId} className="text-xl">
          {alert.name}
        </h2>
        <p className="text-sm text-ink-faint">{FREQUENCY_LABELS[alert.frequency]}</p>
        <p className="text-sm text-ink-soft">{alert.words.join(" · ")}</p>
        <Link to={`/market${alert.query ? `?${alert.query}` : ""}`} className="text-sm underline underline-offset-2">
          Open in the market
        </Link>
      </div>
      {done ? <p className="text-sm text-ink-soft">{done}</p> : null}
      {error && error.field !== "name" && error.field !== "frequency" ? (
        <p role="alert" className="text-sm font-medium text-fault">
          {error.message}
        </p>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Form method="post" className="space-y-2">
          <input type="hidden" name="intent" value="rename" />
          <input type="hidden" name="alertId" value={alert.id} />
          <Field
            label="Name"
            name="name"
            defaultValue={alert.name}
            required
            maxLength={80}
            autoComplete="off"
            error={error?.field === "name" ? error.message : null}
          />
          <Button type="submit" variant="secondary" size="sm" disabled={busy}>
            Rename
          </Button>
        </Form>
        <Form method="post" className="space-y-2">
          <input type="hidden" name="intent" value="frequency" />
          <input type="hidden" name="alertId" value={alert.id} />
          <FrequencyChoice
            name="frequency"
            value={alert.frequency}
            withOff
            error={error?.field === "frequency" ? error.message : undefined}
          />
          <Button type="submit" variant="secondary" size="sm" disabled={busy}>
            Save how often
          </Button>
        </Form>
      </div>
      <Form method="post">
        <input type="hidden" name="intent" value="delete" />
        <input type="hidden" name="alertId" value={alert.id} />
        <Button type="submit" variant="danger" size="sm" disabled={busy} aria-label={`Delete the alert “${alert.name}”`}>
          Delete
        </Button>
      </Form>
    </li>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
