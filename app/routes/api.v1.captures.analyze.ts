import type { Route } from "./+types/api.v1.captures.analyze";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { awaitCapture, capturePath, isRetryable, presentCapture, submitCapture } from "~/bench/capture-api.server";

// POST a capture (multipart: `file` + stated conditions) for analysis. Answers 200 with the analysis
// when the job finishes within `?wait=` seconds (default 2, at most 10), 422 with the reason when the
// job refuses the file in that time, else 202 with where to poll.
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request }) => {
    const user = await requireUser(request);
    const wait = Math.min(10, Math.max(0, Number(new URL(request.url).searchParams.get("wait") ?? 2) || 0));
    const { id } = await submitCapture(request, user.id);
    const finished = wait > 0 ? await awaitCapture(id, wait) : null;
    if (finished?.status === "done") return json(presentCapture(finished));
    if (finished?.status === "failed") {
      const retry = isRetryable(finished) ? { retry: `${capturePath(id)}/retry` } : {};
      return json({ error: finished.errorCode, message: finished.errorMessage, id, poll: capturePath(id), ...retry }, { status: 422 });
    }
    return json({ id, status: "queued", poll: capturePath(id) }, { status: 202, headers: { Location: capturePath(id) } });
  },
});
export const loader = route.loader;
export const action = route.action;
