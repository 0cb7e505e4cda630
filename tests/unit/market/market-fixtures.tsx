import { render } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router";
import { CATEGORIES, COSMETIC_GRADES, SERVICE_STATES } from "@shared/catalogue";
import { MEASURED_FILTERS, SELLER_KINDS, type FilterCounts, type ListingsPage } from "@shared/market-filters";
import type { ListingSummary } from "~/catalogue/types";
import { countryOptions } from "@shared/countries";
import { MarketExplorer } from "~/catalogue/ui/MarketExplorer";

// The market's panel and results in a memory router, as the page mounts them, with made-up answers.

let serial = 0;
export function unit(title: string, over: Partial<ListingSummary> = {}): ListingSummary {
  serial += 1;
  return {
    id: `aaaaaaaa-0000-4000-8000-${String(serial).padStart(12, "0")}`,
    title,
    maker: "Orrin",
    model: title,
    category: "integrated_amplifier",
    era: "1980s",
    priceMinor: 90_000,
    currency: "EUR",
    offersWelcome: false,
    cosmeticGrade: "clean",
    serviceState: "serviced_measured",
    benchVerified: true,
    place: "Keswater",
    seller: { name: "Tallow Bench Works", kind: "workshop", verified: true },
    cover: null,
    keyFigure: { label: "Power into 8 Ω", value: "108", unit: "W", conditions: "both channels driven, 1 kHz" },
    publishedAt: "2026-11-30T10:00:00.000Z",
    ...over,
  };
}

const fill = <T extends string>(list: readonly T[], n: number) => Object.fromEntries(list.map((k) => [k, n])) as Record<T, number>;

export function counts(over: Partial<{ [K in keyof FilterCounts]: Partial<FilterCounts[K]> }> = {}): FilterCounts {
  return {
    category: { ...fill(CATEGORIES, 2), ...over.category },
    condition: { ...fill(COSMETIC_GRADES, 1), ...over.condition },
    service: { ...fill(SERVICE_STATES, 1), ...over.service },
    seller: { ...fill(SELLER_KINDS, 2), ...over.seller },
    verified: typeof over.verified === "number" ? over.verified : 3,
    measured: {
      ...fill(
        MEASURED_FILTERS.map((m) => m.key),
        4,
      ),
      ...over.measured,
    },
  };
}

export function page(items: ListingSummary[], over: Partial<ListingsPage> = {}): ListingsPage {
  return { items, total: items.length, nextCursor: null, counts: counts(), ...over };
}

/** Mounts the market at `url` with the loader's first page answering for `params`. */
export function mountMarket(url: string, first: { params: string; page: ListingsPage }) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: 60_000 } } });
  const router = createMemoryRouter(
    [
      {
        path: "/market",
        element: (
          <MarketExplorer first={first} pager={{ page: 1, pageCount: 1 }} watching={{}} signedIn={false} countries={countryOptions()} />
        ),
      },
    ],
    { initialEntries: [url] },
  );
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}
