import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/reset-password";
import { Button } from "~/components/Button";
import { Field, FormError } from "~/components/Field";
import { AuthPanel, TextLink } from "~/auth/AuthPanel";
import { fieldErrors, ResetPasswordForm } from "~/auth/forms";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { resetPassword } from "~/auth/recovery.server";
import { startSession } from "~/auth/session.server";
import { inspectToken } from "~/auth/tokens.server";

export const meta: Route.MetaFunction = () => [{ title: "Choose a new password · Loadline" }];

const PROBLEMS = {
  unknown: "This reset link is not valid. Check that the whole address from the e-mail was opened.",
  expired: "This reset link has expired; links work for one hour. Ask for a new one below.",
  used: "This reset link has already been used. Ask for a new one if you still need it.",
  suspended: "The password is changed, but this account is suspended, so it cannot sign in.",
} as const;

// The token is in the address: never pass it on to another site in a Referer header.
export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

export async function loader({ params }: Route.LoaderArgs) {
  const state = await inspectToken(params.token, "reset_password");
  return data({ problem: state.ok ? null : PROBLEMS[state.reason] }, { status: state.ok ? 200 : 410 });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await readPageForm(request);
  const parsed = ResetPasswordForm.safeParse({ password: form.get("password") ?? "", confirm: form.get("confirm") ?? "" });
  if (!parsed.success) return data({ problem: null, errors: fieldErrors(parsed.error) }, { status: 400 });
  const result = await resetPassword(params.token, parsed.data.password);
  if (!result.ok) return data({ problem: PROBLEMS[result.reason], errors: {} }, { status: 410 });
  return startSession(request, result.user, "/account", { notice: "Your new password is set, and you are signed in." });
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const problem = actionData?.problem ?? loaderData.problem;
  if (problem) {
    return (
      <AuthPanel title="Choose a new password">
        <FormError>{problem}</FormError>
        <p className="text-sm">
          <TextLink to="/forgot-password">Send me a new link</TextLink>
        </p>
      </AuthPanel>
    );
  }
  const errors: Record<string, string> = actionData?.errors ?? {};
  return (
    <AuthPanel title="Choose a new password" lede="Other devices signed in to this account will be signed out.">
      <Form method="post" className="space-y-4" noValidate>
        <Field
          label="New password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          minLength={10}
          hint="At least 10 characters."
          error={errors.password}
        />
        <Field label="New password again" name="confirm" type="password" autoComplete="new-password" required error={errors.confirm} />
        <Button type="submit" busy={busy} className="w-full">
          Set password and sign in
        </Button>
      </Form>
    </AuthPanel>
  );
}
