import { redirect } from "react-router";
import type { Route } from "./+types/oauth-start";
import { startOAuth } from "~/auth/authenticator.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";

// POST /auth/oauth: off to the identity provider (authorization code with PKCE and state).
export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const form = await readPageForm(request);
  try {
    return await startOAuth(request, String(form.get("redirectTo") ?? "/"));
  } catch (error) {
    // The provider's discovery document could not be read: say so on the sign-in page.
    console.error("OAuth sign-in could not start:", error);
    return redirect("/sign-in?oauth=unavailable");
  }
}

export function loader() {
  return redirect("/sign-in");
}
