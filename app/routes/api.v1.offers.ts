import type { Route } from "./+types/api.v1.offers";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { makeOffer } from "~/offers/offers.server";
import { readBody } from "~/messages/http.server";
import { MakeOfferSchema } from "~/messages/schemas";

// A buyer's offer on a listing that welcomes offers.
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request }) => {
    const user = await requireUser(request);
    const input = await readBody(request, MakeOfferSchema);
    return json({ offer: await makeOffer(user, input) }, { status: 201 });
  },
});
export const loader = route.loader;
export const action = route.action;
