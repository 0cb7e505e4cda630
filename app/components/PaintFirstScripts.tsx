import { useContext, useMemo } from "react";
import {
  Scripts,
  UNSAFE_DataRouterContext as DataRouterContext,
  UNSAFE_DataRouterStateContext as DataRouterStateContext,
  UNSAFE_FrameworkContext as FrameworkContext,
} from "react-router";
import { paintFirstLoader, type LoaderPlan } from "./paint-first-loader";
import { parentRouteIds } from "./parent-route-ids";

/**
 * React Router's <Scripts>, except that the page's JavaScript is fetched only once the server's HTML has
 * been painted (docs/decisions/0035). Every page works without JavaScript, so a phone should show it as
 * soon as the HTML and the style sheet are in, not after 130 kB of script shared its bandwidth and its
 * hydration ran first. <Scripts> announces each module with <link rel="modulepreload"> in the head and
 * imports the route modules statically: the browser then fetches them alongside the style sheet, and
 * the hydration long task can run before the first paint. Here the module script waits for the first
 * frame, then preloads and imports the same modules and hands them to React Router's client entry the
 * way <Scripts> does (the same window globals). Development keeps the stock <Scripts> (Vite's HMR
 * runtime comes through it); SPA mode and subresource integrity, which Loadline does not use, are refused.
 */
export function PaintFirstScripts() {
  if (import.meta.env.DEV) return <Scripts />;
  return import.meta.env.SSR ? <ServerScripts /> : <BrowserScripts />;
}

const BLANK = { context: " ", loader: " " };

// The browser hydrates the server's scripts as they are: they are blank here and left alone, and the
// client build carries none of the code that writes them. (A nonce is hidden from the DOM once parsed.)
function BrowserScripts() {
  return <Both context={BLANK.context} loader={BLANK.loader} />;
}

function ServerScripts() {
  const framework = useContext(FrameworkContext);
  const dataRouter = useContext(DataRouterContext);
  const state = useContext(DataRouterStateContext);
  // Computed once, as <Scripts> does.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const scripts = useMemo(() => serverScripts(framework, dataRouter, state), []);
  return <Both {...scripts} nonce={framework?.nonce} />;
}

function Both({ context, loader, nonce }: { context: string; loader: string; nonce?: string }) {
  return (
    <>
      <script nonce={nonce} suppressHydrationWarning dangerouslySetInnerHTML={{ __html: context }} />
      <script nonce={nonce} type="module" async suppressHydrationWarning dangerouslySetInnerHTML={{ __html: loader }} />
    </>
  );
}

type Contexts = [
  React.ContextType<typeof FrameworkContext>,
  React.ContextType<typeof DataRouterContext>,
  React.ContextType<typeof DataRouterStateContext>,
];

function serverScripts(...[framework, dataRouter, state]: Contexts) {
  if (!framework || !dataRouter || !state) throw new Error("PaintFirstScripts renders inside React Router's framework mode");
  const { manifest, serverHandoffString, isSpaMode, routeDiscovery, ssr, renderMeta } = framework;
  if (isSpaMode || typeof manifest.sri === "object") throw new Error("PaintFirstScripts does not write SPA mode's or integrity's scripts");
  // The server streams the loaders' data after the document only when it knows the scripts are there.
  if (renderMeta) renderMeta.didRenderScripts = true;
  if (!dataRouter.static) return BLANK;
  const { router, staticContext } = dataRouter;
  const fogOfWar = routeDiscovery.mode === "lazy" && ssr === true;
  const plan: LoaderPlan = {
    preloads: [],
    routes: [],
    manifestUrl: fogOfWar ? null : manifest.url,
    partialManifest: null,
    entry: manifest.entry.module,
  };
  plan.preloads.push(...manifest.entry.imports, manifest.entry.module);
  for (const match of state.matches) {
    const route = manifest.routes[match.route.id];
    if (!route) throw new Error(`Route ${match.route.id} not found in the manifest`);
    const modules = [
      route.clientActionModule,
      route.clientLoaderModule,
      route.clientMiddlewareModule,
      route.hydrateFallbackModule,
      route.module,
    ];
    const chunks = modules.filter((m): m is string => typeof m === "string");
    plan.routes.push({ id: match.route.id, chunks });
    plan.preloads.push(...chunks, ...(route.imports ?? []));
  }
  if (fogOfWar) {
    // As React Router's own: the matched routes and those of every parent path, for the first navigations.
    const ids = new Set(state.matches.map((m) => m.route.id));
    for (const id of parentRouteIds(manifest, router.routes, state.location.pathname, router.basename || "/")) ids.add(id);
    plan.partialManifest = { ...manifest, sri: undefined, routes: Object.fromEntries([...ids].map((id) => [id, manifest.routes[id]])) };
  }
  const stream =
    "window.__reactRouterContext.stream = new ReadableStream({start(controller){window.__reactRouterContext.streamController = controller;}}).pipeThrough(new TextEncoderStream());";
  return {
    context: staticContext ? `window.__reactRouterContext = ${serverHandoffString};${stream}` : " ",
    loader: paintFirstLoader(plan),
  };
}
