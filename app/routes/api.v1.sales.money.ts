import type { Route } from "./+types/api.v1.sales.money";
import { requireRole } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { moneyPage } from "~/money/page.server";

// The seller's money per month as JSON (integer minor units), the same months as the page and the CSV.
const route = apiRoute<Route.LoaderArgs>({
  GET: async ({ request }) => {
    const user = await requireRole(request, "seller");
    const { range, problem, books } = await moneyPage(user, new URL(request.url));
    if (problem) throw refusal("bad_request", problem, { issues: [{ path: "from", message: problem }] });
    return json({ range, books });
  },
});
export const loader = route.loader;
export const action = route.action;
