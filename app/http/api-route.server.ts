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
    const method = args.request.method.toUpperCase();
    const handler = handlers[method as Method] ?? (method === "HEAD" ? handlers.GET : undefined);
    try {
      if (!handler) return methodNotAllowed(allowed);
      if (!options.anyOrigin) assertSameOrigin(args.request);
      return await handler(args);
    } catch (error) {
      return errorResponse(error);
    }
  };
  // React Router sends GET and HEAD to the loader and every other method to the action.
  return { loader: handle, action: handle };
}

/** A JSON answer that no cache keeps (everything under /api/ is per caller or per moment). */
export function json(body: unknown, init: ResponseInit = {}): Response {
  const headers = new Headers(init.headers);
  headers.set("Cache-Control", "no-store");
  return Response.json(body, { ...init, headers });
}
