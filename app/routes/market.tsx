import type { ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/market";
import { CATEGORY_LABELS } from "@shared/catalogue";
import { countryOptions } from "@shared/countries";
import { parseMarketFilters } from "@shared/market-filters";
import { marketPageData } from "~/catalogue/market-page.server";
import { MarketExplorer } from "~/catalogue/ui/MarketExplorer";
import { marketDescription } from "~/meta";

export async function loader({ request }: Route.LoaderArgs) {
  // The country names come from the server's locale data: named in the browser, they made the first
  // Intl object of the page, whose locale data loads in one long task while the filters hydrate.
  return { ...(await marketPageData(request)), countries: countryOptions() };
}

// In the browser the panel fetches its own results from /api/v1/listings: a change of filters only
// moves the URL, and an action on the page (watch, compare) changes nothing this loader reads.
export function shouldRevalidate({ currentUrl, nextUrl, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  return currentUrl.pathname === nextUrl.pathname ? false : defaultShouldRevalidate;
}

export const meta: Route.MetaFunction = ({ location }) => {
  const category = parseMarketFilters(new URLSearchParams(location.search)).filters.category;
  const many = category ? CATEGORY_LABELS[category].many : null;
  return [{ title: `${many ?? "Used and vintage hi-fi"} · Market · Loadline` }, { name: "description", content: marketDescription(many) }];
};

export default function Market({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <MarketExplorer {...loaderData} />
    </main>
  );
}
