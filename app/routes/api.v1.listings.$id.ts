import type { Route } from "./+types/api.v1.listings.$id";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { readJson } from "~/http/body.server";
import { editorData } from "~/listings/view.server";
import { patchListing, PATCH_MAX_BYTES } from "~/listings/patch.server";

// A listing for its owner: GET reads everything the editor shows (serial number included);
// PATCH saves any of item, condition and benchSheet (the editor's autosave uses it). Others get 404.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await requireUser(request);
    return json(await editorData(params.id, user));
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
