import type { Route } from "./+types/api.v1.captures.analyze";
import { requireUser } from "~/auth/guards.server";
import { awaitCapture, capturePath, presentCapture, submitCapture } from "~/bench/capture-api.server";

// POST a capture (multipart: `file` + stated conditions) for analysis. Answers 200 with the analysis
// when the job finishes within `?wait=` seconds (default 2, at most 10), else 202 with where to poll.
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return Response.json({ error: "METHOD_NOT_ALLOWED", message: "Use POST." }, { status: 405 });
  const user = await requireUser(request);
  const wait = Math.min(10, Math.max(0, Number(new URL(request.url).searchParams.get("wait") ?? 2) || 0));
  const result = await submitCapture(request, user.id);
  if (!result.ok) return Response.json(result.refusal.body, { status: result.refusal.status });
  const { id } = result.capture;
  const finished = wait > 0 ? await awaitCapture(id, wait) : null;
  if (finished?.status === "done") return Response.json(presentCapture(finished), { status: 200 });
  if (finished?.status === "failed") {
    return Response.json({ error: finished.errorCode, message: finished.errorMessage, id, poll: capturePath(id) }, { status: 422 });
  }
  return Response.json({ id, status: "queued", poll: capturePath(id) }, { status: 202, headers: { Location: capturePath(id) } });
}

export function loader() {
  return Response.json({ error: "METHOD_NOT_ALLOWED", message: "POST a capture here; read results at /api/v1/captures/:id." }, { status: 405 });
}
