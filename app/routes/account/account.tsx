import type { ReactNode } from "react";
import { data, Form, redirect, useNavigation } from "react-router";
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
import { AccountActionForm } from "~/auth/forms";
import { hasRole, requireSession } from "~/auth/guards.server";
import { sessionList, type SessionRow } from "~/auth/session-list.server";
import { endSession } from "~/auth/session.server";
import { revokeOtherSessions, revokeOwnSession } from "~/auth/session-store.server";
import { env } from "~/env.server";
import { payoutStatusFor, startPayoutOnboarding } from "~/payments/payouts.server";
import { PayoutsCard } from "~/payments/ui/PayoutsCard";

export const meta: Route.MetaFunction = () => [{ title: "Your account · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const { user, sessionId } = await requireSession(request);
  // One-time notices (e.g. "confirmed") are shown by the root layout.
  const [methods, sessions] = await Promise.all([signInMethods(user.id), sessionList(user.id, sessionId)]);
  // Back from the provider's onboarding page (?payouts=back): ask the provider now, not only by webhook.
  const back = new URL(request.url).searchParams.get("payouts") === "back";
  const payouts = hasRole(user, "seller") ? await payoutStatusFor(user.id, { refresh: back }) : null;
  return { user, methods, sessions, payouts };
}

const RESEND_MESSAGES = {
  sent: { ok: true, text: "A new confirmation link is on its way. It works for 24 hours." },
  already_verified: { ok: true, text: "Your address is already confirmed." },
  too_many: { ok: false, text: "We have sent several links in the last hour. Please use the newest one, or try again later." },
} as const;

type ActionResult = { ok: boolean; text: string; section: "email" | "sessions" | "payouts" };

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const { user, sessionId } = await requireSession(request);
  const form = await readPageForm(request);
  const parsed = AccountActionForm.safeParse(Object.fromEntries(form));
  if (!parsed.success) return data<ActionResult>({ ok: false, text: "Unknown request.", section: "email" }, { status: 400 });
  const input = parsed.data;
  if (input.intent === "connect-payouts") {
    if (!hasRole(user, "seller"))
      return data<ActionResult>({ ok: false, text: "Payouts are for sellers.", section: "payouts" }, { status: 403 });
    try {
      return redirect(await startPayoutOnboarding(user.id, `${env().appUrl}/account?payouts=back#payouts`));
    } catch (error) {
      console.error("[payouts]", error);
      const text = "The payment provider could not be reached. Please try again in a minute.";
      return data<ActionResult>({ ok: false, text, section: "payouts" }, { status: 503 });
    }
  }
  if (input.intent === "sign-out-session") {
    // Ending this device's own session is signing out.
    if (input.sessionId === sessionId) return endSession(request, "/");
    // Only the account's own sessions match; anyone else's id reads as already ended.
    const ended = await revokeOwnSession(user.id, input.sessionId);
    const text = ended ? "That session is signed out." : "That session had already ended.";
    return data<ActionResult>({ ok: ended, text, section: "sessions" }, { status: ended ? 200 : 404 });
  }
  if (input.intent === "sign-out-others") {
    const count = await revokeOtherSessions(user.id, sessionId);
    const text = count
      ? `Signed out everywhere else (${count} session${count === 1 ? "" : "s"}).`
      : "You were not signed in anywhere else.";
    return data<ActionResult>({ ok: true, text, section: "sessions" });
  }
  try {
    const result = { ...RESEND_MESSAGES[await resendVerification(user.id)], section: "email" as const };
    return data<ActionResult>(result, { status: result.ok ? 200 : 429 });
  } catch (error) {
    if (!(error instanceof MailDeliveryError)) throw error;
    return data<ActionResult>({ ok: false, text: MAIL_UNAVAILABLE, section: "email" }, { status: 503 });
  }
}

export default function Account({ loaderData, actionData }: Route.ComponentProps) {
  const { user, methods, sessions, payouts } = loaderData;
  const busy = useNavigation().state === "submitting";
  const message = (section: ActionResult["section"]) =>
    actionData?.section !== section ? null : actionData.ok ? <Notice>{actionData.text}</Notice> : <FormError>{actionData.text}</FormError>;
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
            {message("email")}
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
            <li key={p.provider}>With your Loadline pass{p.email ? ` (${p.email})` : ""}.</li>
          ))}
        </ul>
        <Form method="post" action="/sign-out">
          <Button type="submit" variant="secondary">
            Sign out
          </Button>
        </Form>
      </Card>

      {payouts ? <PayoutsCard payouts={payouts} message={message("payouts")} busy={busy} /> : null}

      <SessionsCard sessions={sessions} message={message("sessions")} />
    </main>
  );
}

function SessionsCard({ sessions, message }: { sessions: SessionRow[]; message: ReactNode }) {
  const others = sessions.filter((s) => !s.current).length;
  return (
    <Card className="space-y-4">
      <CardTitle>Where you are signed in</CardTitle>
      <p className="text-sm text-ink-soft">
        Each browser stays signed in for up to 14 days. Sign out any you do not recognise, then choose a new password.
      </p>
      {message}
      <ul className="divide-y divide-rule border-y border-rule">
        {sessions.map((s) => (
          <li key={s.id} aria-label={s.browser} className="flex flex-wrap items-center justify-between gap-3 py-3">
            <div className="min-w-0 space-y-0.5">
              <p className="flex flex-wrap items-center gap-2 font-medium">
                {s.browser}
                {s.current ? <Badge tone="trace">This device</Badge> : null}
              </p>
              <p className="text-sm text-ink-soft">
                {s.address ?? "Address not known"} · signed in <time dateTime={s.signedInAt}>{s.signedInLabel}</time> · last seen{" "}
                <time dateTime={s.lastSeenAt}>{s.lastSeenLabel}</time>
              </p>
            </div>
            {s.current ? null : (
              <Form method="post">
                <input type="hidden" name="intent" value="sign-out-session" />
                <input type="hidden" name="sessionId" value={s.id} />
                <Button type="submit" variant="secondary" size="sm" aria-label={`Sign out ${s.browser}, last seen ${s.lastSeenLabel}`}>
                  Sign out
                </Button>
              </Form>
            )}
          </li>
        ))}
      </ul>
      {others > 0 ? (
        <Form method="post">
          <input type="hidden" name="intent" value="sign-out-others" />
          <Button type="submit" variant="secondary">
            Sign out everywhere else
          </Button>
        </Form>
      ) : null}
    </Card>
  );
}
