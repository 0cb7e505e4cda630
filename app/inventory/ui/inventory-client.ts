import type { InventoryActionResult, InventoryPage } from "@shared/inventory";

// The inventory's calls to its JSON API (GET a page, POST an action). A refusal keeps the server's
// sentence and its issues (each naming a unit by id), so the table can say which unit stood in the way.

export interface UnitIssue {
  path: string;
  message: string;
}

export class InventoryError extends Error {
  override name = "InventoryError";
  constructor(
    readonly status: number,
    message: string,
    readonly issues: UnitIssue[] = [],
  ) {
    super(message);
  }
}

async function call<T>(url: string, init: RequestInit): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { ...init, credentials: "same-origin", headers: { Accept: "application/json", ...init.headers } });
  } catch (e) {
    if (init.signal?.aborted) throw e;
    throw new InventoryError(0, "The connection failed; check you are online and try again.");
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) throw new InventoryError(response.status, messageOf(body, response.status), issuesOf(body));
  return body as T; // our own API's answer, typed by the shared contract
}

export function fetchInventory(params: string, signal?: AbortSignal): Promise<InventoryPage> {
  return call(`/api/v1/inventory${params ? `?${params}` : ""}`, { signal });
}

export function postInventoryAction(body: unknown): Promise<InventoryActionResult> {
  return call("/api/v1/inventory", { method: "POST", body: JSON.stringify(body), headers: { "Content-Type": "application/json" } });
}

function messageOf(body: unknown, status: number): string {
  if (body && typeof body === "object" && "message" in body && typeof body.message === "string") return body.message;
  return `The server answered ${status}; try again in a moment.`;
}

function issuesOf(body: unknown): UnitIssue[] {
  if (!body || typeof body !== "object" || !("issues" in body) || !Array.isArray(body.issues)) return [];
  return body.issues.flatMap((i: unknown) =>
    i && typeof i === "object" && "path" in i && "message" in i && typeof i.message === "string"
      ? [{ path: String(i.path), message: i.message }]
      : [],
  );
}
