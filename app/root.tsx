import "./zod-jitless";
import { useState } from "react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import {
  data,
  isRouteErrorResponse,
  Links,
  Meta,
  Outlet,
  Scripts,
  ScrollRestoration,
  useMatches,
  useRouteLoaderData,
  type ShouldRevalidateFunctionArgs,
} from "react-router";
import type { Route } from "./+types/root";
import { getUser } from "~/auth/guards.server";
import { takeNotice } from "~/auth/session.server";
import { SiteFooter, SiteHeader, type HeaderUser } from "~/components/SiteChrome";
import { ErrorPage } from "~/components/ErrorPage";
import { NavigationProgress, useNavigating } from "~/components/NavigationProgress";
import { PaintFirstScripts } from "~/components/PaintFirstScripts";
import { PricingProvider } from "~/components/Price";
import { pricingFor } from "~/currencies/display.server";
import { loggable } from "~/http/log.server";
import { readCompareList } from "~/compare/compare-list.server";
import { unreadCount } from "~/messages/unread.server";
import { CompareTray } from "~/compare/ui/CompareTray";
import { SITE_DESCRIPTION } from "~/meta";
import "./fonts.css";
import "./app.css";

export async function loader({ request }: Route.LoaderArgs) {
  const [{ user, unread }, { notice, headers }, compare, pricing] = await Promise.all([
    // The header's unread badge: one indexed count, and only for a signed-in account.
    getUser(request).then(async (user) => ({ user, unread: user ? await unreadCount(user.id).catch(() => 0) : 0 })),
    takeNotice(request),
    readCompareList(request),
    // A broken rate table must not take every page down with it, but it must not go unnoticed either.
    pricingFor(request).catch((error: unknown) => {
      console.error("[web] the rate table could not be read; prices show in the seller's currency only:", loggable(error));
      return null;
    }),
  ]);
  const header: HeaderUser | null = user ? { displayName: user.displayName, roles: user.roles, unread } : null;
  // Every page may show prices: the buyer's display currency and the rates ride along (a dozen rows).
  // Without them prices still show, in the seller's currency only.
  return data({ user: header, notice, compare, pricing }, { headers });
}

export const meta: Route.MetaFunction = () => [
  { title: "Loadline · used and vintage hi-fi with checked bench measurements" },
  {
    name: "description",
    content: SITE_DESCRIPTION,
  },
];

/** Home, the market and a listing page: where a buyer arrives, often on a phone (route ids from routes.ts). */
const PAINT_FIRST_ROUTES = new Set(["routes/home", "routes/market", "routes/listings/listing"]);

export function Layout({ children }: { children: React.ReactNode }) {
  // Undefined when the root loader itself failed; the header then shows the signed-out state.
  const root = useRouteLoaderData<typeof loader>("root");
  const navigating = useNavigating();
  // The pages a buyer lands on paint before their scripts are fetched (docs/decisions/0035); the working
  // pages (editor, desk, account) hydrate at once, so what is typed straight away gets its live checks.
  // Chosen on the first render only: the server and the hydrating browser agree, and it stays put.
  const matches = useMatches();
  const [paintFirst] = useState(() => matches.some((m) => PAINT_FIRST_ROUTES.has(m.id)));
  return (
    <html lang="en-GB">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="theme-color" content="#f5f0e6" />
        <link rel="icon" href="/favicon.svg" type="image/svg+xml" />
        <Meta />
        <Links />
      </head>
      <body className="flex min-h-dvh flex-col">
        <NavigationProgress />
        <a
          href="#main"
          className="sr-only z-50 rounded-md bg-walnut px-3 py-2 text-card focus:not-sr-only focus:fixed focus:left-3 focus:top-3"
        >
          Skip to content
        </a>
        <SiteHeader user={root?.user ?? null} compareCount={root?.compare.length ?? 0} />
        {root?.notice ? (
          <div role="status" className="border-b border-trace/25 bg-trace-wash">
            <p className="mx-auto max-w-6xl px-4 py-2.5 text-sm font-medium text-trace sm:px-6">{root.notice}</p>
          </div>
        ) : null}
        <PricingProvider pricing={root?.pricing ?? null}>
          <div id="main" aria-busy={navigating || undefined} className="flex flex-1 flex-col">
            {children}
          </div>
          <CompareTray />
          <SiteFooter display={root?.pricing?.display ?? null} />
        </PricingProvider>
        <ScrollRestoration />
        {paintFirst ? <PaintFirstScripts /> : <Scripts />}
      </body>
    </html>
  );
}

// The market's filters move only its URL (the panel fetches its own results): who is signed in and the
// notice do not change with them, so the root's loader is not asked again.
export function shouldRevalidate({ currentUrl, nextUrl, formMethod, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (!formMethod && currentUrl.pathname === "/market" && nextUrl.pathname === "/market") return false;
  return defaultShouldRevalidate;
}

export default function App() {
  // One client per browser session (not per render), so cached API answers survive navigation.
  const [queryClient] = useState(() => new QueryClient({ defaultOptions: { queries: { staleTime: 30_000, retry: 1 } } }));
  return (
    <QueryClientProvider client={queryClient}>
      <Outlet />
    </QueryClientProvider>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) {
    const body: unknown = error.data;
    const message = typeof body === "object" && body && "message" in body ? String(body.message) : undefined;
    return <ErrorPage status={error.status} message={message} />;
  }
  const detail = import.meta.env.DEV && error instanceof Error ? (error.stack ?? error.message) : undefined;
  return <ErrorPage status={500} detail={detail} />;
}
