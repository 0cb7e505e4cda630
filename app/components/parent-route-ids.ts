import { matchRoutes } from "react-router";

// A page's first navigations are to its parent paths ("/listings" from a listing), so the page names
// their routes up front, as React Router's own <Scripts> does. Matching a path flattens and ranks every
// route, about 2 ms a path with Loadline's routes on every page view; a site's parent paths are few, so
// each path's answer is kept per build (the oldest dropped past PATHS_KEPT). The build's manifest is
// the key: React Router makes the route objects afresh for every request.
const PATHS_KEPT = 1_000;
type Routes = Parameters<typeof matchRoutes>[0];
const kept = new WeakMap<object, Map<string, readonly string[]>>();

/** The ids of the routes matching `path` in `routes` (those of the build `build`), kept after the first time. */
export function routeIdsAt(build: object, routes: Routes, path: string, basename = "/"): readonly string[] {
  let paths = kept.get(build);
  if (!paths) kept.set(build, (paths = new Map<string, readonly string[]>()));
  const key = `${basename}\n${path}`;
  let ids = paths.get(key);
  if (!ids) {
    ids = (matchRoutes(routes, path, basename) ?? []).map((m) => m.route.id!);
    if (paths.size >= PATHS_KEPT) paths.delete(paths.keys().next().value!);
    paths.set(key, ids);
  }
  return ids;
}

/** The route ids of `pathname`'s parent paths: "/listings/x/report" gives those of "/", "/listings/x" and "/listings". */
export function parentRouteIds(build: object, routes: Routes, pathname: string, basename = "/"): string[] {
  const segments = pathname.split("/").filter(Boolean);
  const paths = ["/"];
  for (segments.pop(); segments.length; segments.pop()) paths.push(`/${segments.join("/")}`);
  return paths.flatMap((p) => routeIdsAt(build, routes, p, basename));
}
