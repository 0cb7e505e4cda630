import type { Route } from "./+types/api.v1.listings.$id.photos";
import { requireUser } from "~/auth/guards.server";
import { methodNotAllowed, noStore, photoApi } from "~/photos/http.server";
import { uploadPhoto } from "~/photos/upload.server";
import { arrangePhotos, listPhotos, readArrangeInput } from "~/photos/arrange.server";

// A listing's photos, for its seller only.
// GET: every photo with its state (poll while any is processing).
// POST: one photo (multipart, field "photo"); 202 with the new photo, processing.
// PATCH: JSON { order?: [photo ids, first to last], coverId?: photo id }.

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return photoApi(async () => Response.json(await listPhotos(params.id, user.id), { headers: noStore }));
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUser(request);
  if (request.method === "POST") {
    return photoApi(async () => {
      const photo = await uploadPhoto(request, params.id, user.id);
      return Response.json({ photo }, { status: 202, headers: noStore });
    });
  }
  if (request.method === "PATCH") {
    return photoApi(async () => {
      const input = await readArrangeInput(request);
      return Response.json(await arrangePhotos(params.id, user.id, input), { headers: noStore });
    });
  }
  return methodNotAllowed(["GET", "POST", "PATCH"]);
}
