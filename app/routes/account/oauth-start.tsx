import { redirect } from "react-router";
import type { Route } from "./+types/oauth-start";
import { startOAuth } from "~/auth/authenticator.server";
import { assertSameOrigin } from "~/auth/csrf.server";

// POST /auth/oauth: off to the identity provider (authorization code with PKCE and state).
export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await request.clone().formData();
  return startOAuth(request, String(form.get("redirectTo") ?? "/"));
}

export function loader() {
  return redirect("/sign-in");
}
