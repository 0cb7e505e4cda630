import type { Route } from "./+types/api.v1.bench-sheets.check";
import { checkBenchSheetJson, MAX_BODY_BYTES } from "@shared/bench/api";

// POST /api/v1/bench-sheets/check — open to anyone (no account): the check reads nothing and stores nothing.

function methodNotAllowed() {
  return Response.json(
    { error: "method_not_allowed", message: "Send the bench sheet as JSON with POST." },
    { status: 405, headers: { Allow: "POST" } },
  );
}

export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed();
  // Refuse an oversized body before reading it; checkBenchSheetJson re-checks what actually arrives.
  if (Number(request.headers.get("content-length") ?? 0) > MAX_BODY_BYTES)
    return Response.json({ error: "too_large", message: `A bench sheet may be at most ${MAX_BODY_BYTES / 1024} KB of JSON.` }, { status: 413 });
  const result = checkBenchSheetJson(await request.text());
  return Response.json(result.body, { status: result.status });
}

export function loader(_: Route.LoaderArgs) {
  return methodNotAllowed();
}
