// The module script PaintFirstScripts puts at the end of each page (docs/decisions/0035): it waits for the
// page's first contentful paint, then preloads and imports what React Router's <Scripts> would have
// imported at once, sets the same window globals and starts the client entry.

export type LoaderPlan = {
  /** Every module the page's hydration needs, fetched in parallel once the page has painted. */
  preloads: string[];
  /** The matched routes in order, each with its module's chunks (one unless route modules are split). */
  routes: { id: string; chunks: string[] }[];
  /** The whole route manifest's module when routes are not discovered lazily. */
  manifestUrl: string | null;
  /** With lazy route discovery: the routes the first navigations need, as <Scripts> inlines them. */
  partialManifest: unknown;
  entry: string;
};

/** JSON safe inside a <script> element: no "</script" or "<!--" can appear in it. */
export const scriptJson = (value: unknown) => JSON.stringify(value).replace(/</g, "\\u003c");

/** How long a visible page waits for a first contentful paint that does not come (nothing to paint). */
export const PAINT_WAIT_MS = 5_000;

export function paintFirstLoader(plan: LoaderPlan): string {
  const routes = plan.routes.map((r) =>
    r.chunks.length === 1
      ? `import(${scriptJson(r.chunks[0])})`
      : `Promise.all(${scriptJson(r.chunks)}.map((c) => import(c))).then((ms) => Object.assign({}, ...ms))`,
  );
  return [
    // A hidden tab paints nothing until it is shown, so it goes ahead at once.
    `await new Promise((go) => {`,
    `  if (document.visibilityState !== "visible" || !PerformanceObserver.supportedEntryTypes?.includes("paint")) return go();`,
    `  new PerformanceObserver((list, seen) => {`,
    `    if (list.getEntriesByName("first-contentful-paint").length) { seen.disconnect(); go(); }`,
    `  }).observe({ type: "paint", buffered: true });`,
    `  setTimeout(go, ${PAINT_WAIT_MS});`,
    `});`,
    `for (const href of ${scriptJson([...new Set(plan.preloads)])}) {`,
    `  const link = document.createElement("link");`,
    `  link.rel = "modulepreload";`,
    `  link.href = href;`,
    `  document.head.appendChild(link);`,
    `}`,
    plan.manifestUrl ? `await import(${scriptJson(plan.manifestUrl)});` : "",
    `const routes = await Promise.all([${routes.join(", ")}]);`,
    plan.partialManifest ? `window.__reactRouterManifest = ${scriptJson(plan.partialManifest)};` : "",
    `window.__reactRouterRouteModules = {${plan.routes.map((r, i) => `${scriptJson(r.id)}: routes[${i}]`).join(", ")}};`,
    `import(${scriptJson(plan.entry)});`,
  ]
    .filter(Boolean)
    .join("\n");
}
