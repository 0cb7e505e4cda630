import { redirect } from "react-router";
import type { Route } from "./+types/editor-index";

// /sell/:id opens the first step, whose frame decides who may see it (this loader runs alongside the
// frame's, not after it). The id comes back into a Location header, so it is encoded: a raw one with
// control characters made that header invalid and the answer a 500.
export function loader({ params }: Route.LoaderArgs) {
  return redirect(`/sell/${encodeURIComponent(params.id)}/item`);
}
