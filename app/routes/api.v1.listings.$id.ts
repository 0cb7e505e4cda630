import type { Route } from "./+types/api.v1.listings.$id";
import { requireUser } from "~/auth/guards.server";
import { editorData } from "~/listings/view.server";
import { patchListing } from "~/listings/patch.server";
import { listingApi, readJsonBody } from "~/listings/http.server";

// A listing for its owner: GET reads everything the editor shows (serial number included);
// PATCH saves any of item, condition and benchSheet (the editor's autosave uses it). Others get 404.

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return listingApi(async () => Response.json(await editorData(params.id, user), { headers: { "Cache-Control": "no-store" } }));
}

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "PATCH")
    return Response.json({ error: "method_not_allowed", message: "Use GET to read a listing and PATCH to change it." }, { status: 405, headers: { Allow: "GET, PATCH" } });
  const user = await requireUser(request);
  return listingApi(async () => {
    const body = await readJsonBody(request, 600 * 1024);
    const { bench } = await patchListing(params.id, user.id, body);
    const view = await editorData(params.id, user);
    return Response.json(
      { ...view, ...(bench ? { sheetChanged: bench.changed, wasVerified: bench.wasVerified } : {}) },
      { headers: { "Cache-Control": "no-store" } },
    );
  });
}
