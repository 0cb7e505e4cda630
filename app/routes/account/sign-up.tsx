import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-up";
import { Button } from "~/components/Button";
import { Field, FormError } from "~/components/Field";
import { AuthPanel, Notice, TextLink } from "~/auth/AuthPanel";
import { fieldErrors, SignUpForm } from "~/auth/forms";
import { safeRedirect } from "~/auth/redirect";
import { registerAccount } from "~/auth/accounts.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { getUser } from "~/auth/guards.server";

export const meta: Route.MetaFunction = () => [{ title: "Create an account · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await getUser(request)) throw redirect("/account");
  const redirectTo = safeRedirect(new URL(request.url).searchParams.get("redirectTo"), "/");
  return { redirectTo };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await readPageForm(request);
  const values = { displayName: String(form.get("displayName") ?? ""), email: String(form.get("email") ?? "") };
  const parsed = SignUpForm.safeParse({ ...values, password: form.get("password") ?? "" });
  if (!parsed.success) return data({ sent: false as const, values, errors: fieldErrors(parsed.error) }, { status: 400 });
  // A taken address gets the same answer; the worker mails its owner instead of a confirmation link.
  await registerAccount(parsed.data);
  return { sent: true as const, email: parsed.data.email };
}

export default function SignUp({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  if (actionData?.sent) {
    return (
      <AuthPanel
        title="Check your inbox"
        lede={
          <>
            We have sent a message to <strong>{actionData.email}</strong>.
          </>
        }
      >
        <Notice>Open the link in it to confirm your address and sign in. The link works for 24 hours.</Notice>
        <p className="text-sm text-ink-soft">
          Nothing there after a few minutes? Look in the spam folder, or <TextLink to="/sign-up">start again</TextLink> with the right
          address.
        </p>
      </AuthPanel>
    );
  }
  const errors: Record<string, string> = actionData?.errors ?? {};
  const back = loaderData.redirectTo !== "/" ? `?${new URLSearchParams({ redirectTo: loaderData.redirectTo })}` : "";
  return (
    <AuthPanel
      title="Create an account"
      lede="Buy hi-fi whose measurements have been checked, and sell your own with a bench sheet."
      footer={
        <p>
          Already have an account? <TextLink to={`/sign-in${back}`}>Sign in</TextLink>
        </p>
      }
    >
      <FormError>{errors.form}</FormError>
      <Form method="post" className="space-y-4" noValidate>
        <Field
          label="Your name"
          name="displayName"
          autoComplete="name"
          required
          maxLength={80}
          hint="Shown to the people you buy from and sell to."
          defaultValue={actionData?.values.displayName}
          error={errors.displayName}
        />
        <Field
          label="E-mail address"
          name="email"
          type="email"
          autoComplete="email"
          required
          hint="We send a link to confirm it."
          defaultValue={actionData?.values.email}
          error={errors.email}
        />
        <Field
          label="Password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          minLength={10}
          hint="At least 10 characters. A few unrelated words make a strong one."
          error={errors.password}
        />
        <Button type="submit" busy={busy} className="w-full">
          Create account
        </Button>
      </Form>
    </AuthPanel>
  );
}
