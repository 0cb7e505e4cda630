import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/forgot-password";
import { Button } from "~/components/Button";
import { Field, FormError } from "~/components/Field";
import { AuthPanel, Notice, TextLink } from "~/auth/AuthPanel";
import { fieldErrors, ForgotPasswordForm } from "~/auth/forms";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { requestPasswordReset } from "~/auth/recovery.server";

export const meta: Route.MetaFunction = () => [{ title: "Forgotten password · Loadline" }];

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await readPageForm(request);
  const email = String(form.get("email") ?? "");
  const parsed = ForgotPasswordForm.safeParse({ email });
  if (!parsed.success) return data({ sent: false as const, email, errors: fieldErrors(parsed.error) }, { status: 400 });
  // Queued for the worker, which alone looks the address up: the same answer, as fast, for any address.
  await requestPasswordReset(parsed.data.email);
  return { sent: true as const, email: parsed.data.email };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  if (actionData?.sent) {
    return (
      <AuthPanel title="Check your inbox" footer={<TextLink to="/sign-in">Back to sign in</TextLink>}>
        <Notice>
          If a Loadline account uses {actionData.email}, we have sent it a link to choose a new password. The link works once and for one
          hour.
        </Notice>
      </AuthPanel>
    );
  }
  const errors: Record<string, string> = actionData?.errors ?? {};
  return (
    <AuthPanel
      title="Forgotten your password?"
      lede="Enter the address you sign in with and we will e-mail you a link to choose a new one."
      footer={<TextLink to="/sign-in">Back to sign in</TextLink>}
    >
      <FormError>{errors.form}</FormError>
      <Form method="post" className="space-y-4" noValidate>
        <Field
          label="E-mail address"
          name="email"
          type="email"
          autoComplete="email"
          required
          defaultValue={actionData?.email}
          error={errors.email}
        />
        <Button type="submit" busy={busy} className="w-full">
          Send me a link
        </Button>
      </Form>
    </AuthPanel>
  );
}
