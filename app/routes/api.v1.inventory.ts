import type { Route } from "./+types/api.v1.inventory";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { readJson } from "~/http/body.server";
import { inventoryPage } from "~/inventory/query.server";
import { runInventoryAction } from "~/inventory/actions.server";
import { readInventoryQuery } from "@shared/inventory";

// The signed-in seller's inventory: GET a page of their units (the /sell table's filters, sort and page
// as query parameters), POST a bulk action or one unit's new price. Own units only: an id that is not
// the seller's answers 404 as a missing one.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request }) => {
    const user = await requireUser(request);
    return json(await inventoryPage(user.id, readInventoryQuery(new URL(request.url).searchParams)));
  },
  POST: async ({ request }) => {
    const user = await requireUser(request);
    // A hundred ids and a few fields: 16 kB is ample.
    return json(await runInventoryAction(user, await readJson(request, 16 * 1024)));
  },
});
export const loader = route.loader;
export const action = route.action;
