import type { Route } from "./+types/api.v1.imports.$id";
import { requireRole } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { ownImport } from "~/imports/imports.server";

// One of the workshop's imports: its status and progress (the import page polls it while it runs).
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await requireRole(request, "workshop");
    return json({ import: await ownImport(user.id, params.id) });
  },
});
export const loader = route.loader;
export const action = route.action;
