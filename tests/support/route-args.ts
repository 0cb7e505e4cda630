import type { AppLoadContext } from "react-router";

/** What React Router hands a loader or action, for calling a route module directly. */
export function routeArgs<P extends Record<string, string>>(request: Request, params: P, pattern = new URL(request.url).pathname) {
  const context: AppLoadContext = {};
  return { request, url: new URL(request.url), params, pattern, context };
}
