import type { Route } from "./+types/api.v1.restoration-templates.$id";
import { requireRole } from "~/auth/guards.server";
import { BODY_LIMITS, readJson } from "~/http/body.server";
import { apiRoute, json } from "~/http/api-route.server";
import { deleteTemplate, getTemplate, updateTemplate } from "~/restoration-templates/templates.server";

// One of the workshop's restoration templates: read, replace (PUT takes the whole template), delete.
// Someone else's answers 404, as a missing one does.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await requireRole(request, "workshop");
    return json({ template: await getTemplate(user.id, params.id) });
  },
  PUT: async ({ request, params }) => {
    const user = await requireRole(request, "workshop");
    const body = await readJson(request, BODY_LIMITS.form, "The template");
    return json({ template: await updateTemplate(user.id, params.id, body) });
  },
  DELETE: async ({ request, params }) => {
    const user = await requireRole(request, "workshop");
    await deleteTemplate(user.id, params.id);
    return new Response(null, { status: 204, headers: { "Cache-Control": "no-store" } });
  },
});
export const loader = route.loader;
export const action = route.action;
