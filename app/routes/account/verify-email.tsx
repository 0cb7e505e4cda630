import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/verify-email";
import { Button } from "~/components/Button";
import { FormError } from "~/components/Field";
import { AuthPanel, TextLink } from "~/auth/AuthPanel";
import { confirmEmail } from "~/auth/accounts.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { startSession } from "~/auth/session.server";
import { inspectToken } from "~/auth/tokens.server";

export const meta: Route.MetaFunction = () => [{ title: "Confirm your e-mail address · Loadline" }];

const PROBLEMS = {
  unknown: "This confirmation link is not valid. Check that the whole address from the e-mail was opened.",
  expired: "This confirmation link has expired. Sign in and ask for a new one from your account page.",
  used: "This confirmation link has already been used. If that was you, your address is confirmed: just sign in.",
  suspended: "Your address is confirmed, but this account is suspended, so it cannot sign in.",
} as const;

// Opening the link shows a button; confirming (which also signs in) is a POST, so mail scanners
// that fetch links do not use the token up, and another site cannot sign a visitor in with it.
// The token is in the address: never pass it on to another site in a Referer header.
export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

export async function loader({ params }: Route.LoaderArgs) {
  const state = await inspectToken(params.token, "verify_email");
  return data({ problem: state.ok ? null : PROBLEMS[state.reason] }, { status: state.ok ? 200 : 410 });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const result = await confirmEmail(params.token);
  if (!result.ok) return data({ problem: PROBLEMS[result.reason] }, { status: 410 });
  return startSession(request, result.user, "/account", { notice: "Your e-mail address is confirmed. Welcome to Loadline." });
}

export default function VerifyEmail({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const problem = actionData?.problem ?? loaderData.problem;
  if (problem) {
    return (
      <AuthPanel title="Confirm your e-mail address">
        <FormError>{problem}</FormError>
        <p className="text-sm">
          <TextLink to="/sign-in">Go to sign in</TextLink>
        </p>
      </AuthPanel>
    );
  }
  return (
    <AuthPanel title="Confirm your e-mail address" lede="One click and your address is confirmed; you will be signed in.">
      <Form method="post">
        <Button type="submit" busy={busy} className="w-full">
          Confirm and sign in
        </Button>
      </Form>
    </AuthPanel>
  );
}
