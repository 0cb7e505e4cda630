// The watch API as the browser calls it. Errors carry the server's own sentence (the API's one shape)
// so the button can say why a watch did not stick.

export class WatchError extends Error {
  override name = "WatchError";
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

export async function sendWatch(listingId: string, watch: boolean): Promise<{ listingId: string; watching: boolean }> {
  let response: Response;
  try {
    response = await fetch(`/api/v1/watches/${encodeURIComponent(listingId)}`, {
      method: watch ? "PUT" : "DELETE",
      headers: { Accept: "application/json" },
      credentials: "same-origin",
    });
  } catch {
    throw new WatchError(0, "The connection failed; check you are online and try again.");
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    const message = body && typeof body === "object" && "message" in body && typeof body.message === "string" ? body.message : null;
    throw new WatchError(response.status, message ?? `The server answered ${response.status}; try again in a moment.`);
  }
  return body as { listingId: string; watching: boolean };
}
