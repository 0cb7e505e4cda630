import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-in";
import { Button } from "~/components/Button";
import { Field, FormError } from "~/components/Field";
import { AuthPanel, TextLink } from "~/auth/AuthPanel";
import { fieldErrors, SignInForm } from "~/auth/forms";
import { safeRedirect } from "~/auth/redirect";
import { authenticator, PASSWORD } from "~/auth/authenticator.server";
import { SignInError } from "~/auth/accounts.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm, formRequest } from "~/http/body.server";
import { getUser } from "~/auth/guards.server";
import { startSession } from "~/auth/session.server";
import { OAUTH_UNVERIFIED } from "~/auth/identities.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Loadline" }];

const OAUTH_MESSAGES: Record<string, string> = {
  cancelled: "Signing in with your Loadline pass was cancelled. You can try again, or use your password.",
  failed: "Signing in with your Loadline pass did not complete. Please try again.",
  unavailable: "The Loadline pass service is not answering just now. Sign in with your password, or try again in a few minutes.",
  unverified: OAUTH_UNVERIFIED,
  suspended: "This account is suspended, so it cannot sign in. Write to the moderators if you think this is a mistake.",
};

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const redirectTo = safeRedirect(url.searchParams.get("redirectTo"), "/");
  if (await getUser(request)) throw redirect(redirectTo);
  const oauthError = OAUTH_MESSAGES[url.searchParams.get("oauth") ?? ""] ?? null;
  return { redirectTo, oauthError };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await readPageForm(request);
  const redirectTo = safeRedirect(form.get("redirectTo"), "/");
  const email = String(form.get("email") ?? "");
  const parsed = SignInForm.safeParse({ email: form.get("email") ?? "", password: form.get("password") ?? "" });
  if (!parsed.success) return data({ email, errors: fieldErrors(parsed.error), formError: null }, { status: 400 });
  try {
    // The strategy reads the form itself: hand it the one already read and checked.
    const user = await authenticator.authenticate(PASSWORD, formRequest(request, form));
    return startSession(request, user, redirectTo);
  } catch (error) {
    if (!(error instanceof SignInError)) throw error;
    const limited = error.code === "rate_limited";
    return data(
      { email, errors: {}, formError: error.message },
      {
        status: limited ? 429 : error.code === "suspended" ? 403 : 401,
        headers: limited ? { "Retry-After": String(error.retryAfterSeconds ?? 60) } : undefined,
      },
    );
  }
}

export default function SignIn({ loaderData, actionData }: Route.ComponentProps) {
  const { redirectTo, oauthError } = loaderData;
  const busy = useNavigation().state === "submitting";
  const errors: Record<string, string> = actionData?.errors ?? {};
  const back = redirectTo !== "/" ? `?${new URLSearchParams({ redirectTo })}` : "";
  return (
    <AuthPanel
      title="Sign in"
      lede="Welcome back to the bench."
      footer={
        <p>
          New to Loadline? <TextLink to={`/sign-up${back}`}>Create an account</TextLink>
        </p>
      }
    >
      <FormError>{actionData?.formError ?? oauthError}</FormError>
      <Form method="post" className="space-y-4" noValidate>
        <input type="hidden" name="redirectTo" value={redirectTo} />
        <Field
          label="E-mail address"
          name="email"
          type="email"
          autoComplete="email"
          required
          defaultValue={actionData?.email}
          error={errors.email}
        />
        <Field label="Password" name="password" type="password" autoComplete="current-password" required error={errors.password} />
        <div className="flex items-center justify-between gap-3">
          <Button type="submit" busy={busy}>
            Sign in
          </Button>
          <TextLink to="/forgot-password" className="text-sm">
            Forgotten your password?
          </TextLink>
        </div>
      </Form>
      <div className="flex items-center gap-3 text-xs uppercase tracking-[0.14em] text-ink-faint" aria-hidden="true">
        <span className="h-px flex-1 bg-rule" />
        or
        <span className="h-px flex-1 bg-rule" />
      </div>
      <Form method="post" action="/auth/oauth" reloadDocument>
        <input type="hidden" name="redirectTo" value={redirectTo} />
        <Button type="submit" variant="secondary" className="w-full">
          Sign in with your Loadline pass
        </Button>
      </Form>
    </AuthPanel>
  );
}
