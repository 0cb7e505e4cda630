import type { Route } from "./+types/api.v1.captures.$id";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { findOwnCapture, presentCapture } from "~/bench/capture-api.server";

// A capture's status and, once done, its analysis and bench-sheet readings. Owner only.
const route = apiRoute<Route.LoaderArgs>({
  GET: async ({ request, params }) => {
    const user = await requireUser(request);
    const capture = await findOwnCapture(params.id, user.id);
    if (!capture) throw refusal("not_found", "No capture of yours has that id.");
    return json(presentCapture(capture));
  },
});
export const loader = route.loader;
export const action = route.action;
