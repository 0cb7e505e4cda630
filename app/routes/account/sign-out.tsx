import { Form, redirect } from "react-router";
import type { Route } from "./+types/sign-out";
import { Button } from "~/components/Button";
import { AuthPanel } from "~/auth/AuthPanel";
import { assertSameOrigin } from "~/auth/csrf.server";
import { getUser } from "~/auth/guards.server";
import { endSession } from "~/auth/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign out · Loadline" }];

// Signing out changes state, so it only happens on POST; a GET shows the button.
export async function loader({ request }: Route.LoaderArgs) {
  const user = await getUser(request);
  if (!user) throw redirect("/");
  return { email: user.email };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  return endSession(request, "/");
}

export default function SignOut({ loaderData }: Route.ComponentProps) {
  return (
    <AuthPanel
      title="Sign out"
      lede={
        <>
          You are signed in as <strong>{loaderData.email}</strong>.
        </>
      }
    >
      <Form method="post">
        <Button type="submit" className="w-full">
          Sign out
        </Button>
      </Form>
    </AuthPanel>
  );
}
