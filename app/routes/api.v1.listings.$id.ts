import type { Route } from "./+types/api.v1.listings.$id";
import { getUser, requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { readJson } from "~/http/body.server";
import { editorData } from "~/listings/view.server";
import { patchListing, PATCH_MAX_BYTES } from "~/listings/patch.server";
import { ListingNotFound } from "~/listings/errors.server";
import { refusal } from "~/http/errors.server";
import { publicListing } from "~/listings/public-api.server";
import { publicJson } from "~/catalogue/public-json.server";

// One path, two readers. The OWNER gets the editor's view (serial number included; GET) and saves
// with PATCH (the editor's autosave). EVERYONE ELSE gets the public view of a live or sold unit; any
// other listing is 404 to a signed-in visitor and 401 to an anonymous one (it may be theirs).
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await getUser(request);
    const own = user ? await editorData(params.id, user).catch(notFoundAsNull) : null;
    if (own) return json(own);

    const view = await publicListing(params.id, new URL(request.url).searchParams.get("zone"));
    if (view) return publicJson(view, { varyCookie: true });
    if (!user) await requireUser(request);
    throw refusal("not_found", "No listing is for sale at that address.");
  },
  PATCH: async ({ request, params }) => {
    const user = await requireUser(request);
    const { bench } = await patchListing(params.id, user.id, await readJson(request, PATCH_MAX_BYTES));
    const view = await editorData(params.id, user);
    return json({ ...view, ...(bench ? { sheetChanged: bench.changed, wasVerified: bench.wasVerified } : {}) });
  },
});
export const loader = route.loader;
export const action = route.action;

function notFoundAsNull(error: unknown): null {
  if (error instanceof ListingNotFound) return null;
  throw error;
}
