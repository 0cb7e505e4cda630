import { redirect } from "react-router";
import type { Route } from "./+types/oauth-start";
import { startOAuth } from "~/auth/authenticator.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { formRequest, readPageForm } from "~/http/body.server";
import { methodNotAllowed } from "~/http/errors.server";

// POST /auth/oauth: off to the identity provider (authorization code with PKCE and state).
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed(["POST"]);
  assertSameOrigin(request);
  const form = await readPageForm(request);
  try {
    // The strategy may read the request again: hand it one whose body is the form already read.
    return await startOAuth(formRequest(request, form), String(form.get("redirectTo") ?? "/"));
  } catch (error) {
    // The provider's discovery document could not be read: say so on the sign-in page.
    console.error("OAuth sign-in could not start:", error);
    return redirect("/sign-in?oauth=unavailable");
  }
}

export function loader() {
  return redirect("/sign-in");
}
