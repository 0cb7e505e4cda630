import { data, Form, isRouteErrorResponse, useNavigation } from "react-router";
import type { Route } from "./+types/unsubscribe";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { inspectUnsubscribe, unsubscribe, type UnsubscribeTarget } from "~/alerts/unsubscribe.server";
import { AuthPanel, TextLink } from "~/auth/AuthPanel";
import { Button } from "~/components/Button";
import { ErrorPage } from "~/components/ErrorPage";

// An unsubscribe link from a watch notice or a spec alert. No account needed: the token is the
// authority. Opening the link only asks; the button (or a mail client's one-click POST, RFC 8058) stops
// the mail, so a scanner that follows links unsubscribes nobody. An unknown or expired token is a 404.

export const meta: Route.MetaFunction = () => [{ title: "Unsubscribe · Loadline" }, { name: "robots", content: "noindex" }];

// The token is in the address: never pass it on to another site in a Referer header.
export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer", "Cache-Control": "no-store" });

function notFound(): never {
  throw data({ message: "This unsubscribe link is not valid or has expired." }, { status: 404, statusText: "Not Found" });
}

export async function loader({ params }: Route.LoaderArgs) {
  const target = await inspectUnsubscribe(params.token);
  if (!target) notFound();
  return { target, done: false };
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  // A one-click body ("List-Unsubscribe=One-Click") or the page's own form: read, size-limited, and unused.
  await readPageForm(request);
  const target = await unsubscribe(params.token);
  if (!target) notFound();
  return { target, done: true };
}

function what(t: UnsubscribeTarget): string {
  switch (t.kind) {
    case "watch":
      return "e-mails about the units you watch (price drops, sold, withdrawn)";
    case "alert":
      return `e-mails from your spec alert “${t.alertName}”`;
    case "alerts":
      return "e-mails from all your spec alerts";
  }
}

export default function Unsubscribe({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const { target, done } = actionData ?? loaderData;
  const manage = target.kind === "watch" ? { to: "/watching", label: "your watch list" } : { to: "/alerts", label: "your spec alerts" };
  if (done || target.stopped) {
    return (
      <AuthPanel title="Unsubscribed" lede={`You will get no more ${what(target)}.`}>
        <p role="status" className="text-sm text-ink-soft">
          Changed your mind? Sign in and turn them back on from <TextLink to={manage.to}>{manage.label}</TextLink>.
        </p>
      </AuthPanel>
    );
  }
  return (
    <AuthPanel title="Unsubscribe" lede={`Stop ${what(target)}?`}>
      <Form method="post">
        <Button type="submit" busy={busy} className="w-full">
          Unsubscribe
        </Button>
      </Form>
      <p className="text-sm text-ink-soft">
        You can also manage them from <TextLink to={manage.to}>{manage.label}</TextLink> once signed in.
      </p>
    </AuthPanel>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
