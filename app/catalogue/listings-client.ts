import type { ListingsPage } from "@shared/market-filters";

// The market's results as the browser asks for them: GET /api/v1/listings with the canonical filter
// parameters. Errors keep the server's sentence and the parameters it names, so the panel can show
// each message beside its field.

export interface FieldIssue {
  path: string;
  message: string;
}

export class ListingsError extends Error {
  override name = "ListingsError";
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
  }
}

/** One page of results; `cursor` continues after a page's `nextCursor`. */
export async function fetchListings(params: string, cursor: string | null, signal?: AbortSignal): Promise<ListingsPage> {
  const query = new URLSearchParams(params);
  // The API pages by cursor only: the HTML page's number is the loader's business.
  query.delete("page");
  if (cursor) query.set("cursor", cursor);
  const search = query.toString();
  let response: Response;
  try {
    response = await fetch(`/api/v1/listings${search ? `?${search}` : ""}`, {
      headers: { Accept: "application/json" },
      credentials: "same-origin",
      signal,
    });
  } catch (e) {
    if (signal?.aborted) throw e;
    throw new ListingsError(0, "The connection failed; check you are online and try again.");
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) throw new ListingsError(response.status, messageOf(body, response.status), issuesOf(body));
  return body as ListingsPage; // our own API's answer, typed by the shared contract
}

function messageOf(body: unknown, status: number): string {
  if (body && typeof body === "object" && "message" in body && typeof body.message === "string") return body.message;
  return `The server answered ${status}; try again in a moment.`;
}

function issuesOf(body: unknown): FieldIssue[] {
  if (!body || typeof body !== "object" || !("issues" in body) || !Array.isArray(body.issues)) return [];
  return body.issues.flatMap((i: unknown) =>
    i && typeof i === "object" && "path" in i && "message" in i && typeof i.message === "string"
      ? [{ path: Array.isArray(i.path) ? String(i.path[0]) : String(i.path), message: i.message }]
      : [],
  );
}
