// The browser build's chunks, grouped by the public pages that load them (docs/decisions/0017).
// Left to itself the bundler makes one chunk per distinct set of route modules that share code; with
// forty-odd routes that is thirty small files on the market page, each gzipped alone, each with its own
// import glue. Here a module's chunk is decided only by which of the three public pages (home, the
// market, a listing) load it at once: those loaded by all three go in one chunk, those loaded by two in
// another, and so on. Code no public page loads, or that only one route loads, is left as it was.
import type { Plugin } from "vite";

type Page = "home" | "market" | "listing";
const PAGES: Page[] = ["home", "market", "listing"];
/** The route modules of the public pages (React Router's client build names each route's module so). */
const ROUTE_OF: [RegExp, Page][] = [
  [/\/app\/routes\/home\.tsx\?/, "home"],
  [/\/app\/routes\/market\.tsx\?/, "market"],
  [/\/app\/routes\/listings\/listing\.tsx\?/, "listing"],
];
/** Entry modules every page loads: the client entry and the root route. */
const EVERY_PAGE = [/entry\.client\.[jt]sx?$/, /\/app\/root\.tsx\?/];

type Graph = { isEntry: boolean; importers: readonly string[] };

/** Which public pages load `id` at once (static imports only: a lazy chunk stays lazy), and how many entries reach it. */
export function pagesLoading(id: string, info: (id: string) => Graph | null): { pages: Set<Page>; entries: number } {
  const pages = new Set<Page>();
  const seen = new Set<string>([id]);
  const queue = [id];
  let entries = 0;
  while (queue.length) {
    const at = queue.pop()!;
    const node = info(at);
    if (!node) continue;
    if (node.isEntry) {
      entries++;
      if (EVERY_PAGE.some((r) => r.test(at))) PAGES.forEach((p) => pages.add(p));
      for (const [r, p] of ROUTE_OF) if (r.test(at)) pages.add(p);
    }
    for (const next of node.importers)
      if (!seen.has(next)) {
        seen.add(next);
        queue.push(next);
      }
  }
  return { pages, entries };
}

/** The group a module belongs to, or null to leave it to the bundler. */
export function groupOf(id: string, info: (id: string) => Graph | null): string | null {
  // Libraries stay with the bundler: their index modules import everything, so what reaches them says
  // little about what a page uses, and a chunk of ours must not carry a whole library for one import.
  if (id.includes("/node_modules/") || id.startsWith("\0")) return null;
  const { pages, entries } = pagesLoading(id, info);
  // A module of one route alone stays in that route's chunk; one no public page loads is not ours to move.
  if (pages.size === 0 || entries < 2) return null;
  return `pages-${PAGES.filter((p) => pages.has(p)).join("-")}`;
}

/**
 * The plugin that reads the module graph once the build has it, and the `codeSplitting` groups that use
 * it: one group per set of public pages, the larger sets first, so a module shared by all three never
 * lands in a chunk that only two load.
 */
export function publicPageChunks(): {
  plugin: Plugin;
  groups: { name: string; test: (id: string) => boolean; priority: number; includeDependenciesRecursively: boolean }[];
} {
  const group = new Map<string, string>();
  const plugin: Plugin = {
    name: "loadline:public-page-chunks",
    apply: "build",
    applyToEnvironment: (env) => env.name === "client",
    // The groups take our modules without their libraries (includeDependenciesRecursively: false), which
    // the bundler allows only when an entry chunk may export more than its module did; React Router
    // asks for "exports-only", and a route chunk with a few more exports is harmless.
    configResolved(config) {
      const options = config.build.rolldownOptions;
      if (options.preserveEntrySignatures === "exports-only") options.preserveEntrySignatures = "allow-extension";
    },
    buildEnd() {
      group.clear();
      const info = (id: string) => this.getModuleInfo(id);
      for (const id of this.getModuleIds()) {
        const g = groupOf(id, info);
        if (g) group.set(id, g);
      }
    },
  };
  const sets: Page[][] = [];
  for (let mask = 7; mask > 0; mask--) sets.push(PAGES.filter((_, i) => mask & (1 << i)));
  sets.sort((a, b) => b.length - a.length);
  const groups = sets.map((pages, i) => {
    const name = `pages-${pages.join("-")}`;
    return { name, test: (id: string) => group.get(id) === name, priority: sets.length - i, includeDependenciesRecursively: false };
  });
  return { plugin, groups };
}
