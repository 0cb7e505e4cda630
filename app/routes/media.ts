import type { Route } from "./+types/media";
import { mediaResponse } from "~/catalogue/media.server";

// Photo sizes from object storage (public: keys are random; originals are never served).
export async function loader({ request, params }: Route.LoaderArgs) {
  return mediaResponse(params["*"] ?? "", request);
}
