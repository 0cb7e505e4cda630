import type { Route } from "./+types/document";
import { requireRole } from "~/auth/guards.server";
import { HttpError } from "~/http/errors.server";
import { idSchema } from "@shared/ids";
import { documentResponse } from "~/workshops/document-response.server";

// An application's private document, through a short-lived link signed for the moderator viewing it.
// A refusal (a forged link, an expired one) is a short plain answer: the link opens in a tab of its own.
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireRole(request, "moderator");
  const id = idSchema("application").safeParse(params.id);
  try {
    if (!id.success) return plain(404, "There is no such document.");
    return await documentResponse(new URL(request.url), id.data, user.id);
  } catch (e) {
    if (e instanceof HttpError) return plain(e.status, e.message);
    throw e;
  }
}

function plain(status: number, text: string): Response {
  return new Response(text, { status, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });
}
