import type { Route } from "./+types/api.v1.certificates.$id";
import { apiRoute, json } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { certificateStatus } from "~/certificates/status.server";

// Whether a bench certificate still matches its listing's bench sheet: open to anyone, as the page its
// QR code leads to is (nothing private in it).
const route = apiRoute<Route.LoaderArgs>({
  GET: async ({ params }) => {
    const status = await certificateStatus(params.id);
    if (!status) throw refusal("not_found", "There is no bench certificate with that id.");
    return json(status);
  },
});
export const loader = route.loader;
export const action = route.action;
