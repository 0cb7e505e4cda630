import { UUID_PATTERN } from "@shared/id-pattern";

// Which units a buyer compares: at most four listing ids, in the order they were chosen. The page
// reads them from `?ids=a,b,c` (shareable); the buyer's own list rides in a cookie (compare-list.server.ts).

export const MAX_COMPARED = 4;

/** What `?ids=` may hold before it is read at all: four ids and their commas, with room for spaces. */
const MAX_IDS_TEXT = 400;

/** `first`: when there are too many, the first four, for a link that compares those. */
export type CompareIds = { ok: true; ids: string[] } | { ok: false; message: string; first?: string[] };

/** Reads every `ids` parameter (`?ids=a,b` or `?ids=a&ids=b`): ids in order, repeats dropped. */
export function parseCompareIds(values: readonly string[]): CompareIds {
  const text = values.join(",");
  if (text.length > MAX_IDS_TEXT) return { ok: false, message: tooMany(null) };
  const entries = text
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  // The id rule itself, not a zod schema: the compare toggle on every card imports this module, and a
  // schema built at load time would bring zod to every public page.
  const bad = entries.filter((e) => !UUID_PATTERN.test(e));
  if (bad.length) {
    const shown = bad.slice(0, 3).map((b) => `“${b.length > 40 ? `${b.slice(0, 40)}…` : b}”`);
    const more = bad.length > 3 ? ` and ${bad.length - 3} more` : "";
    return {
      ok: false,
      message: `This link names ${bad.length === 1 ? "something that is" : "things that are"} not a listing: ${shown.join(", ")}${more}. Each unit is named by the id in its page's address.`,
    };
  }
  const ids = [...new Set(entries.map((e) => e.toLowerCase()))];
  if (ids.length > MAX_COMPARED) return { ok: false, message: tooMany(ids.length), first: ids.slice(0, MAX_COMPARED) };
  return { ok: true, ids };
}

function tooMany(n: number | null): string {
  return `Up to ${MAX_COMPARED} units can be compared side by side; this link names ${n ?? "more than that"}. Remove some and try again.`;
}

/** The compare page for these ids; `/compare` for none. */
export function compareHref(ids: readonly string[]): string {
  return ids.length ? `/compare?ids=${ids.join(",")}` : "/compare";
}
