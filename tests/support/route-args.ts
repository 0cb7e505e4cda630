import type { AppLoadContext, UNSAFE_DataWithResponseInit as DataWithResponseInit } from "react-router";

/** What React Router hands a loader or action, for calling a route module directly. */
export function routeArgs<P extends Record<string, string>>(request: Request, params: P, pattern = new URL(request.url).pathname) {
  const context: AppLoadContext = {};
  return { request, url: new URL(request.url), params, pattern, context };
}

/** Whether what a loader or action returned (or threw) came from React Router's data(). */
export function isData(value: unknown): value is DataWithResponseInit<unknown> {
  return typeof value === "object" && value !== null && "type" in value && value.type === "DataWithResponseInit";
}
