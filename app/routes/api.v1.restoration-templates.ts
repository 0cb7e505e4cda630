import type { Route } from "./+types/api.v1.restoration-templates";
import { requireRole } from "~/auth/guards.server";
import { BODY_LIMITS, readJson } from "~/http/body.server";
import { apiRoute, json } from "~/http/api-route.server";
import { createTemplate, listTemplates } from "~/restoration-templates/templates.server";

// A workshop's restoration templates: the list (by title) and a new one.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request }) => {
    const user = await requireRole(request, "workshop");
    return json({ templates: await listTemplates(user.id) });
  },
  POST: async ({ request }) => {
    const user = await requireRole(request, "workshop");
    const body = await readJson(request, BODY_LIMITS.form, "The template");
    return json({ template: await createTemplate(user.id, body) }, { status: 201 });
  },
});
export const loader = route.loader;
export const action = route.action;
