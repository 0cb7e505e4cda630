import type { Route } from "./+types/api.v1.threads";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { openThread, threadList } from "~/messages/threads.server";
import { readBody } from "~/messages/http.server";
import { OpenThreadSchema } from "~/messages/schemas";

// The signed-in user's threads (GET, unread first), and opening the buyer's thread about a listing
// (POST; the same thread again when it exists).
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request }) => {
    const user = await requireUser(request);
    return json({ threads: await threadList(user.id) }, { headers: { "Cache-Control": "private, no-store" } });
  },
  POST: async ({ request }) => {
    const user = await requireUser(request);
    const { listingId } = await readBody(request, OpenThreadSchema);
    const thread = await openThread(user.id, listingId);
    return json({ thread: { id: thread.id, listingId: thread.listingId } }, { status: 201 });
  },
});
export const loader = route.loader;
export const action = route.action;
