import type { Route } from "./+types/api.v1.listings.$id.photos.$photoId";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { deletePhoto } from "~/photos/arrange.server";

// DELETE one photo of the seller's listing: the row and every stored size. Answers the remaining photos.
const route = apiRoute<Route.ActionArgs>({
  DELETE: async ({ request, params }) => {
    const user = await requireUser(request);
    return json(await deletePhoto(params.id, user.id, params.photoId));
  },
});
export const loader = route.loader;
export const action = route.action;
