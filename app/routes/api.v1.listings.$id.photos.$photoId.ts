import type { Route } from "./+types/api.v1.listings.$id.photos.$photoId";
import { requireUser } from "~/auth/guards.server";
import { methodNotAllowed, noStore, photoApi } from "~/photos/http.server";
import { deletePhoto } from "~/photos/arrange.server";

// DELETE one photo of the seller's listing: the row and every stored size. Answers the remaining photos.

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUser(request);
  if (request.method !== "DELETE") return methodNotAllowed(["DELETE"]);
  return photoApi(async () => Response.json(await deletePhoto(params.id, user.id, params.photoId), { headers: noStore }));
}

export function loader() {
  return methodNotAllowed(["DELETE"]);
}
