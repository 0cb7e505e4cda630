import { assertSameOrigin } from "~/auth/csrf.server";
import { errorResponse, methodNotAllowed } from "./errors.server";

// The API's edge in one place, so route modules stay a list of handlers: the method is checked (405
// with Allow), state-changing requests must come from our own origin (403 cross_origin), and whatever
// a handler throws becomes the one error shape. Guards, body reading and the service call are the
// handler's own lines, in that order.

type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
type Args = { request: Request };
type Handler<A> = (args: A) => Promise<Response> | Response;

export interface ApiRouteOptions {
  /**
   * Skip the same-origin rule: only for callers that are machines authenticated by other means
   * (the payments webhook's signature).
   */
  anyOrigin?: boolean;
}

export function apiRoute<A extends Args>(handlers: Partial<Record<Method, Handler<A>>>, options: ApiRouteOptions = {}) {
  const allowed = Object.keys(handlers) as Method[];
  const handle = async (args: A): Promise<Response> => {
    const started = performance.now();
    const method = args.request.method.toUpperCase();
    const handler = handlers[method as Method] ?? (method === "HEAD" ? handlers.GET : undefined);
    let response: Response;
    try {
      if (!handler) response = methodNotAllowed(allowed);
      else {
        if (!options.anyOrigin) assertSameOrigin(args.request);
        response = await handler(args);
      }
    } catch (error) {
      response = errorResponse(error);
    }
    return withServerTiming(closeIfUnread(args.request, response), performance.now() - started);
  };
  // React Router sends GET and HEAD to the loader and every other method to the action.
  return { loader: handle, action: handle };
}

// Refused before its body was read (401, 403, 405 …): the rest of the upload is not wanted, so the
// connection closes after the answer instead of waiting on a half-read request.
function closeIfUnread(request: Request, response: Response): Response {
  if (request.body && !request.bodyUsed && !response.headers.has("Connection")) {
    try {
      response.headers.set("Connection", "close");
    } catch {
      // a Response with immutable headers: left as it is
    }
  }
  return response;
}

// How long the server spent on the answer, body serialised included: `npm run bench` reads it to tell
// the server's time from the network's, and the browser's developer tools show it.
function withServerTiming(response: Response, ms: number): Response {
  try {
    response.headers.append("Server-Timing", `app;dur=${ms.toFixed(1)}`);
  } catch {
    // a Response with immutable headers: left as it is
  }
  return response;
}

/** A JSON answer that no cache keeps (everything under /api/ is per caller or per moment). */
export function json(body: unknown, init: ResponseInit = {}): Response {
  const headers = new Headers(init.headers);
  headers.set("Cache-Control", "no-store");
  return Response.json(body, { ...init, headers });
}
