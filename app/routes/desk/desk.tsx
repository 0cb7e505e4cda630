import { data } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/desk";
import { requireRole } from "~/auth/guards.server";
import { DESK_KINDS, deskQueue } from "~/desk/queue.server";
import { DeskQueue } from "~/desk/ui/DeskQueue";

// /desk: the review desk's one queue, oldest first, filtered by ?kind=.

export const meta: Route.MetaFunction = () => [{ title: "Review desk · Loadline" }];

const KindParam = z.enum(DESK_KINDS).nullable().catch(null);

export async function loader({ request }: Route.LoaderArgs) {
  await requireRole(request, "moderator");
  const kind = KindParam.parse(new URL(request.url).searchParams.get("kind"));
  return data(await deskQueue({ kind }), { headers: { "Cache-Control": "private, no-store" } });
}

export default function Desk({ loaderData }: Route.ComponentProps) {
  return <DeskQueue queue={loaderData} />;
}
