import type { Route } from "./+types/api.v1.captures.$id";
import { requireUser } from "~/auth/guards.server";
import { findOwnCapture, presentCapture } from "~/bench/capture-api.server";

// A capture's status and, once done, its analysis and bench-sheet readings. Owner only.
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const capture = await findOwnCapture(params.id, user.id);
  if (!capture) return Response.json({ error: "NOT_FOUND", message: "No capture of yours has that id." }, { status: 404 });
  return Response.json(presentCapture(capture), { headers: { "Cache-Control": "no-store" } });
}
