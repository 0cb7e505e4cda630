import type { Route } from "./+types/api.v1.watches";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { watchList } from "~/listings/watch.server";

// The signed-in buyer's watch list, newest watch first, as the market's cards show each unit.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request }) => {
    const user = await requireUser(request);
    return json({ watches: await watchList(user.id) });
  },
});
export const loader = route.loader;
export const action = route.action;
