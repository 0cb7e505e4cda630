import type { Route } from "./+types/api.v1.listings.$id.photos";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { uploadPhoto } from "~/photos/upload.server";
import { arrangePhotos, listPhotos, readArrangeInput } from "~/photos/arrange.server";

// A listing's photos, for its seller only.
// GET: every photo with its state (poll while any is processing).
// POST: one photo (multipart, field "photo"); 202 with the new photo, processing.
// PATCH: JSON { order?: [photo ids, first to last], coverId?: photo id }.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await requireUser(request);
    return json(await listPhotos(params.id, user.id));
  },
  POST: async ({ request, params }) => {
    const user = await requireUser(request);
    const photo = await uploadPhoto(request, params.id, user.id);
    return json({ photo }, { status: 202 });
  },
  PATCH: async ({ request, params }) => {
    const user = await requireUser(request);
    return json(await arrangePhotos(params.id, user.id, await readArrangeInput(request)));
  },
});
export const loader = route.loader;
export const action = route.action;
