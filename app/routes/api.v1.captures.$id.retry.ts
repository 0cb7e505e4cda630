import type { Route } from "./+types/api.v1.captures.$id.retry";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { capturePath, retryCapture } from "~/bench/capture-api.server";

// Queue again a capture whose analysis failed on our side (storage or database trouble) once its
// retries ran out. Owner only; anything else about the capture answers 409.
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request, params }) => {
    const user = await requireUser(request);
    const capture = await retryCapture(params.id, user.id);
    if (!capture) throw refusal("not_found", "No capture of yours has that id.");
    const poll = capturePath(capture.id);
    return json({ id: capture.id, status: "queued", poll }, { status: 202, headers: { Location: poll } });
  },
});
export const loader = route.loader;
export const action = route.action;
