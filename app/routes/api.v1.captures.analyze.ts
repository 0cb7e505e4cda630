import type { Route } from "./+types/api.v1.captures.analyze";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { assertEditable, ownListing } from "~/listings/access.server";
import { awaitCapture, capturePath, isRetryable, presentCapture, submitCapture } from "~/bench/capture-api.server";

// POST a capture (multipart: `file` + stated conditions) for analysis. Answers 200 with the analysis
// when the job finishes within `?wait=` seconds (default 2, at most 10), 422 with the reason when the
// job refuses the file in that time, else 202 with where to poll. `?listing=` ties it to that listing.
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request }) => {
    const user = await requireUser(request);
    const query = new URL(request.url).searchParams;
    const wait = Math.min(10, Math.max(0, Number(query.get("wait") ?? 2) || 0));
    // `?listing=<id>`: uploaded for that draft of the caller's (someone else's answers 404, as a missing one).
    const listing = query.has("listing") ? await ownListing(query.get("listing"), user.id) : null;
    if (listing) assertEditable(listing);
    const { id } = await submitCapture(request, user.id, listing ? { listingId: listing.id } : {});
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
