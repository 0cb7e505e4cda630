import { redirect } from "react-router";
import type { Route } from "./+types/editor-index";

// /sell/:id opens the first step; the frame's loader has already checked the owner.
export function loader({ params }: Route.LoaderArgs) {
  return redirect(`/sell/${params.id}/item`);
}
