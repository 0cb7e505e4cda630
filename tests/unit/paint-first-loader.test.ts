import { describe, expect, it } from "vitest";
import { paintFirstLoader, type LoaderPlan } from "~/components/paint-first-loader";

// The loader PaintFirstScripts puts on every page (docs/decisions/0035), run here with a stand-in
// browser: `import(` becomes a call we record, so the order of what it does can be checked.

const plan: LoaderPlan = {
  preloads: ["/assets/jsx.js", "/assets/entry.js", "/assets/root.js", "/assets/jsx.js", "/assets/home.js"],
  routes: [
    { id: "root", chunks: ["/assets/root.js"] },
    { id: "routes/home", chunks: ["/assets/home-action.js", "/assets/home.js"] },
  ],
  manifestUrl: null,
  partialManifest: { note: "</script><script>alert(1)</script>" },
  entry: "/assets/entry.js",
};

async function run(source: string, { visible = true } = {}) {
  const events: string[] = [];
  let paint: ((list: { getEntriesByName(n: string): unknown[] }, seen: { disconnect(): void }) => void) | null = null;
  const window: Record<string, unknown> = {};
  const env = {
    window,
    document: {
      visibilityState: visible ? "visible" : "hidden",
      createElement: (): { rel?: string; href?: string } => ({}),
      head: { appendChild: (l: { rel: string; href: string }) => events.push(`${l.rel} ${l.href}`) },
    },
    PerformanceObserver: Object.assign(
      function (cb: typeof paint) {
        paint = cb;
        return { observe: () => events.push("observe paint") };
      },
      { supportedEntryTypes: ["paint"] },
    ),
    setTimeout: () => 0,
    load: (url: string) => {
      events.push(`import ${url}`);
      return Promise.resolve({ [url]: true });
    },
  };
  const body = source.replace(/\bimport\(/g, "load(").replace(/window\./g, "env.window.");
  // eslint-disable-next-line @typescript-eslint/no-implied-eval -- the loader is code by design; this runs it
  const fn = new Function(
    "env",
    `const { document, PerformanceObserver, setTimeout, load } = env; return (async () => {\n${body}\n})();`,
  ) as (e: typeof env) => Promise<void>;
  const done = fn(env);
  return {
    events,
    window,
    done,
    paint: () => paint?.({ getEntriesByName: (n) => (n === "first-contentful-paint" ? [{}] : []) }, { disconnect: () => undefined }),
  };
}

const tick = () => new Promise((r) => setTimeout(r, 0));

describe("the paint-first loader", () => {
  it("fetches nothing until the first contentful paint, then preloads each module once and imports the routes, then the entry", async () => {
    const page = await run(paintFirstLoader(plan));
    await tick();
    expect(page.events).toEqual(["observe paint"]);
    page.paint();
    await page.done;
    await tick();
    expect(page.events).toEqual([
      "observe paint",
      "modulepreload /assets/jsx.js",
      "modulepreload /assets/entry.js",
      "modulepreload /assets/root.js",
      "modulepreload /assets/home.js",
      "import /assets/root.js",
      "import /assets/home-action.js",
      "import /assets/home.js",
      "import /assets/entry.js",
    ]);
    // React Router's client entry reads these, as <Scripts> sets them: a split route's chunks merged.
    expect(page.window.__reactRouterRouteModules).toEqual({
      root: { "/assets/root.js": true },
      "routes/home": { "/assets/home-action.js": true, "/assets/home.js": true },
    });
    expect(page.window.__reactRouterManifest).toEqual(plan.partialManifest);
  });

  it("goes ahead at once in a hidden tab, which paints nothing until it is shown", async () => {
    const page = await run(paintFirstLoader(plan), { visible: false });
    await page.done;
    expect(page.events).not.toContain("observe paint");
    expect(page.events.at(-1)).toBe("import /assets/entry.js");
  });

  it("cannot close its script element with what the manifest holds", () => {
    expect(paintFirstLoader(plan)).not.toMatch(/<\/script|<script/i);
  });
});
