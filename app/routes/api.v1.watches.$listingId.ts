import type { Route } from "./+types/api.v1.watches.$listingId";
import { requireUser } from "~/auth/guards.server";
import { refusal } from "~/http/errors.server";
import { apiRoute, json } from "~/http/api-route.server";
import { setWatch } from "~/listings/watch.server";

// Watch (PUT) and stop watching (DELETE) one listing. Both say the state they want, so repeating
// either changes nothing. Someone else's draft answers like a listing that does not exist.
async function put(request: Request, listingId: string, watch: boolean): Promise<Response> {
  const user = await requireUser(request);
  const result = await setWatch(user, listingId, watch);
  if (!result.ok) throw refusal(result.status === 404 ? "not_found" : "conflict", result.reason);
  return json({ listingId, watching: result.watching });
}

const route = apiRoute<Route.ActionArgs>({
  PUT: ({ request, params }) => put(request, params.listingId, true),
  DELETE: ({ request, params }) => put(request, params.listingId, false),
});
export const loader = route.loader;
export const action = route.action;
