import type { Conversation, ThreadSummary } from "./types";

// The threads API as the browser calls it. Errors carry the server's own sentence (the API's one
// shape) and the field it names, so the compose box can say why a message did not go.

export class ThreadApiError extends Error {
  override name = "ThreadApiError";
  constructor(
    readonly status: number,
    message: string,
    readonly path: string | null = null,
  ) {
    super(message);
  }
}

async function call<T>(url: string, init: RequestInit = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { credentials: "same-origin", ...init, headers: { Accept: "application/json", ...init.headers } });
  } catch {
    throw new ThreadApiError(0, "The connection failed; check you are online and try again.");
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    const b = body && typeof body === "object" ? (body as { message?: unknown; issues?: { path?: unknown }[] }) : {};
    const message = typeof b.message === "string" ? b.message : `The server answered ${response.status}; try again in a moment.`;
    const path = typeof b.issues?.[0]?.path === "string" ? b.issues[0].path : null;
    throw new ThreadApiError(response.status, message, path);
  }
  return body as T;
}

export const threadKey = (threadId: string) => ["thread", threadId] as const;
export const threadsKey = ["threads"] as const;

export function fetchConversation(threadId: string): Promise<Conversation> {
  return call<Conversation>(`/api/v1/threads/${encodeURIComponent(threadId)}/messages`);
}

export function fetchThreads(): Promise<{ threads: ThreadSummary[] }> {
  return call(`/api/v1/threads`);
}

export interface SentMessageView {
  id: string;
  body: string;
  masked: boolean;
  at: string;
}

export function postMessage(threadId: string, body: string): Promise<{ message: SentMessageView }> {
  return call(`/api/v1/threads/${encodeURIComponent(threadId)}/messages`, {
    method: "POST",
    headers: { "Content-Type": "application/json" },
    body: JSON.stringify({ body }),
  });
}
