import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/account";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { Notice, TextLink } from "~/auth/AuthPanel";
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from "~/auth/roles";
import { resendVerification, signInMethods } from "~/auth/accounts.server";
import { MAIL_UNAVAILABLE, MailDeliveryError } from "~/auth/emails.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { requireUser } from "~/auth/guards.server";

export const meta: Route.MetaFunction = () => [{ title: "Your account · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  // One-time notices (e.g. "confirmed") are shown by the root layout.
  return { user, methods: await signInMethods(user.id) };
}

const RESEND_MESSAGES = {
  sent: { ok: true, text: "A new confirmation link is on its way. It works for 24 hours." },
  already_verified: { ok: true, text: "Your address is already confirmed." },
  too_many: { ok: false, text: "We have sent several links in the last hour. Please use the newest one, or try again later." },
} as const;

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  if (form.get("intent") !== "resend-verification") {
    return data({ ok: false, text: "Unknown request." }, { status: 400 });
  }
  try {
    const result = RESEND_MESSAGES[await resendVerification(user.id)];
    return data(result, { status: result.ok ? 200 : 429 });
  } catch (error) {
    if (!(error instanceof MailDeliveryError)) throw error;
    return data({ ok: false, text: MAIL_UNAVAILABLE }, { status: 503 });
  }
}

export default function Account({ loaderData, actionData }: Route.ComponentProps) {
  const { user, methods } = loaderData;
  const busy = useNavigation().state === "submitting";
  return (
    <main className="mx-auto w-full max-w-3xl space-y-8 px-4 py-10">
      <PageHeader overline="Your account" title={user.displayName} lede={user.email} />

      <Card className="space-y-4">
        <CardTitle>E-mail address</CardTitle>
        <p className="flex flex-wrap items-center gap-2">
          <span className="font-medium">{user.email}</span>
          {user.emailVerified ? <Badge tone="trace">Confirmed</Badge> : <Badge tone="brass">Not confirmed yet</Badge>}
        </p>
        {user.emailVerified ? null : (
          <>
            <p className="text-sm text-ink-soft">
              Confirm your address with the link we e-mailed you. Publishing a listing needs a confirmed address.
            </p>
            {actionData ? actionData.ok ? <Notice>{actionData.text}</Notice> : <FormError>{actionData.text}</FormError> : null}
            <Form method="post">
              <input type="hidden" name="intent" value="resend-verification" />
              <Button type="submit" variant="secondary" busy={busy}>
                Send me a new confirmation link
              </Button>
            </Form>
          </>
        )}
      </Card>

      <Card className="space-y-4">
        <CardTitle>Roles</CardTitle>
        <ul className="space-y-2">
          {user.roles.map((role) => (
            <li key={role} className="flex flex-wrap items-baseline gap-2">
              <Badge tone={role === "buyer" ? "neutral" : "walnut"}>{ROLE_LABELS[role]}</Badge>
              <span className="text-sm text-ink-soft">{ROLE_DESCRIPTIONS[role]}</span>
            </li>
          ))}
        </ul>
      </Card>

      <Card className="space-y-3">
        <CardTitle>Signing in</CardTitle>
        <ul className="space-y-1 text-sm">
          <li>
            {methods.hasPassword ? (
              "With your e-mail address and password."
            ) : (
              <>
                No password yet. <TextLink to="/forgot-password">Choose one with a link by e-mail</TextLink>.
              </>
            )}
          </li>
          {methods.providers.map((p) => (
            <li key={p.provider}>With Loadline ID{p.email ? ` (${p.email})` : ""}.</li>
          ))}
        </ul>
        <Form method="post" action="/sign-out">
          <Button type="submit" variant="secondary">
            Sign out
          </Button>
        </Form>
      </Card>
    </main>
  );
}
