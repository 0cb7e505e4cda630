import type { Route } from "./+types/contest-photo";
import { requireUser } from "~/auth/guards.server";
import { requestClock } from "~/buying/clock.server";
import { contestPhotoResponse } from "~/orders/contest-photo-links.server";

// /orders/:orderId/contest-photos/:n?until=…&sig=…: one contest photo, metadata-free, through a
// short-lived link made for its viewer (the buyer who sent it, or a moderator). Never cached.
export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireUser(request);
  return contestPhotoResponse(request, params, viewer, await requestClock());
}
