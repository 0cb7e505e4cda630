import fs from "node:fs";
import path from "node:path";
import type { RouteConfigEntry } from "@react-router/dev/routes";
import routes from "~/routes";

// Every address the app answers, read from app/routes.ts itself: the leaves of the route tree (a
// layout is reached through its children), each with what its modules export. A route added there
// shows up here without anyone remembering to list it.

export interface RouteLeaf {
  /** The URL pattern, e.g. `/sell/:id/item`; an index route has its parent's. */
  pattern: string;
  /** The leaf's module, relative to app/. */
  file: string;
  /** A page (some module on the way has a component) or a resource route (loader/action only). */
  kind: "page" | "resource";
  /** Whether a loader runs for a GET (the leaf's or a parent's). */
  hasLoader: boolean;
  /** Whether the leaf itself takes writes (actions only ever run on the leaf). */
  hasAction: boolean;
}

const APP = path.resolve(import.meta.dirname, "../../../app");

function exportsOf(file: string) {
  const source = fs.readFileSync(path.join(APP, file), "utf8");
  const named = (name: string) =>
    new RegExp(
      `export\\s+(async\\s+)?function\\s+${name}\\b|export\\s+(const|let)\\s+${name}\\b|export\\s*\\{[^}]*\\b${name}\\b[^}]*\\}`,
    ).test(source);
  return { loader: named("loader"), action: named("action"), component: /export\s+default\b/.test(source) };
}

function join(parent: string, child: string | undefined): string {
  const joined = [parent.replace(/\/+$/, ""), (child ?? "").replace(/^\/+/, "")].filter(Boolean).join("/");
  return joined.startsWith("/") ? joined : `/${joined}`;
}

export function routeLeaves(config: RouteConfigEntry[] = routes): RouteLeaf[] {
  const leaves: RouteLeaf[] = [];
  const walk = (entries: RouteConfigEntry[], parentPath: string, ancestors: ReturnType<typeof exportsOf>[]) => {
    for (const entry of entries) {
      const pattern = entry.index ? parentPath || "/" : join(parentPath, entry.path);
      const own = exportsOf(entry.file);
      const chain = [...ancestors, own];
      if (entry.children?.length) {
        walk(entry.children, pattern, chain);
        continue;
      }
      leaves.push({
        pattern,
        file: entry.file,
        kind: chain.some((m) => m.component) ? "page" : "resource",
        hasLoader: chain.some((m) => m.loader),
        hasAction: own.action,
      });
    }
  };
  walk(config, "", []);
  return leaves;
}

/** The address of a pattern with its params filled in (`*` takes the splat). */
export function fill(pattern: string, params: Record<string, string>): string {
  return pattern.replace(/:(\w+)|\*$/g, (whole, name: string | undefined) => {
    const key = name ?? "*";
    const value = params[key];
    if (value === undefined) throw new Error(`${pattern}: no value for ${whole}`);
    return key === "*" ? value : encodeURIComponent(value);
  });
}

/** React Router's single-fetch address for a page: `/x.data`, and `/_root.data` for `/`. */
export function dataPath(pathname: string): string {
  const [p, q] = pathname.split("?");
  return `${p === "/" ? "/_root" : p.replace(/\/+$/, "")}.data${q ? `?${q}` : ""}`;
}
