import { redirect } from "react-router";
import type { Route } from "./+types/oauth-callback";
import { finishOAuth } from "~/auth/authenticator.server";
import { startSession } from "~/auth/session.server";

// GET /auth/oauth/callback: the provider sends the browser back here with a code and the state.
export async function loader({ request }: Route.LoaderArgs) {
  const outcome = await finishOAuth(request);
  const headers = new Headers();
  for (const c of outcome.clearCookies) headers.append("Set-Cookie", c);
  if (outcome.ok) return startSession(request, outcome.user, outcome.redirectTo, { headers });
  if (outcome.error) console.error("OAuth sign-in failed:", outcome.error);
  return redirect(`/sign-in?oauth=${outcome.code}`, { headers });
}
