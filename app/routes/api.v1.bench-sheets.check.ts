import type { Route } from "./+types/api.v1.bench-sheets.check";
import { checkBenchSheetData, MAX_BODY_BYTES } from "@shared/bench/api";
import { apiRoute, json } from "~/http/api-route.server";
import { readJson } from "~/http/body.server";

// POST /api/v1/bench-sheets/check — open to anyone (no account): the check reads nothing and stores nothing.
const route = apiRoute<Route.ActionArgs>({
  POST: async ({ request }) => {
    const result = checkBenchSheetData(await readJson(request, MAX_BODY_BYTES, "A bench sheet"));
    return json(result.body, { status: result.status });
  },
});
export const loader = route.loader;
export const action = route.action;
