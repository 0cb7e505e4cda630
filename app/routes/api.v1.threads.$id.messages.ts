import type { Route } from "./+types/api.v1.threads.$id.messages";
import { requireUser } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { conversation, sendMessage } from "~/messages/threads.server";
import { readBody } from "~/messages/http.server";
import { MessageInputSchema } from "~/messages/schemas";

// One conversation: GET the thread with its messages and offers (and mark it read), POST a message.
// Someone else's thread is a 404.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request, params }) => {
    const user = await requireUser(request);
    return json(await conversation(user.id, params.id), { headers: { "Cache-Control": "private, no-store" } });
  },
  POST: async ({ request, params }) => {
    const user = await requireUser(request);
    const { body } = await readBody(request, MessageInputSchema);
    return json({ message: await sendMessage(user.id, params.id, body) }, { status: 201 });
  },
});
export const loader = route.loader;
export const action = route.action;
