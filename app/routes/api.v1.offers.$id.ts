import type { Route } from "./+types/api.v1.offers.$id";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { answerOffer } from "~/offers/offers.server";
import { readBody } from "~/messages/http.server";
import { OfferAnswerSchema } from "~/messages/schemas";

// Answer an offer: accept, decline or counter (the side it was made to), withdraw (the side that made it).
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request, params }) => {
    const user = await requireUser(request);
    const answer = await readBody(request, OfferAnswerSchema);
    return json({ offer: await answerOffer(user.id, params.id, answer) });
  },
});
export const loader = route.loader;
export const action = route.action;
