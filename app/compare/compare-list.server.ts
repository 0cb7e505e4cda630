import { createCookie } from "react-router";
import { z } from "zod";
import { env } from "~/env.server";
import { UUID_PATTERN } from "@shared/ids";
import { MAX_COMPARED } from "./selection";

// The buyer's compare list: up to four listing ids in a cookie of their own, so choosing units works
// signed out and without JavaScript (plain forms post to /compare). It names listings only; whether
// each may be shown is decided when the compare page loads, like for any id in a link.

const LIFETIME_S = 30 * 86_400;

function makeCookie() {
  const { secureCookies } = env();
  return createCookie(secureCookies ? "__Host-loadline_compare" : "loadline_compare", {
    httpOnly: true,
    sameSite: "lax",
    secure: secureCookies,
    path: "/",
    maxAge: LIFETIME_S,
  });
}
let cookie: ReturnType<typeof makeCookie> | undefined;
const compareCookie = () => (cookie ??= makeCookie());

const ListSchema = z.array(z.string().regex(UUID_PATTERN)).catch([]);

/** The ids in the request's compare cookie; an unreadable cookie reads as an empty list. */
export async function readCompareList(request: Request): Promise<string[]> {
  let value: unknown;
  try {
    value = await compareCookie().parse(request.headers.get("Cookie"));
  } catch {
    return [];
  }
  return [...new Set(ListSchema.parse(value).map((id) => id.toLowerCase()))].slice(0, MAX_COMPARED);
}

/** The Set-Cookie value that stores `ids` (an empty list expires the cookie). */
export function compareListCookie(ids: readonly string[]): Promise<string> {
  return ids.length ? compareCookie().serialize([...ids]) : compareCookie().serialize([], { maxAge: 0 });
}

export type ListChange = { ok: true; ids: string[] } | { ok: false; reason: string };

/** The list after adding, removing or clearing; adding past four is refused with the reason. */
export function changeList(ids: readonly string[], change: { intent: "add" | "remove" | "clear"; listingId?: string }): ListChange {
  if (change.intent === "clear") return { ok: true, ids: [] };
  const id = change.listingId!.toLowerCase();
  if (change.intent === "remove") return { ok: true, ids: ids.filter((x) => x !== id) };
  if (ids.includes(id)) return { ok: true, ids: [...ids] };
  if (ids.length >= MAX_COMPARED)
    return { ok: false, reason: `You are comparing ${MAX_COMPARED} units already, the most that fit side by side. Remove one first.` };
  return { ok: true, ids: [...ids, id] };
}
