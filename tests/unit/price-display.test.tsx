// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen } from "@testing-library/react";
import { createMemoryRouter, RouterProvider } from "react-router";
import { ListingCard } from "~/components/ListingCard";
import { ApproxPrice, Price, PricingProvider, type PricingData } from "~/components/Price";
import type { ListingSummary } from "~/catalogue/types";

// A price in the seller's currency, and beside it, for a buyer who shows prices in another, an
// approximate figure marked "≈" that screen readers read as "about".

const PRICING: PricingData = {
  display: "EUR",
  rates: { EUR: { perEur: "1", minorDigits: 2 }, GBP: { perEur: "0.86", minorDigits: 2 } },
};

const LISTING: ListingSummary = {
  id: "00000000-0000-4000-8000-000000000001",
  title: "Carrowain RT-100 integrated amplifier",
  maker: "Carrowain",
  model: "RT-100",
  category: "integrated_amplifier",
  era: "1981",
  priceMinor: 120_000,
  currency: "GBP",
  offersWelcome: false,
  cosmeticGrade: "clean",
  serviceState: "serviced_measured",
  benchVerified: false,
  place: "Lowmarsh, GB",
  seller: { name: "Private seller", kind: "private", verified: false },
  cover: null,
  keyFigure: null,
  publishedAt: "2026-12-01T10:00:00.000Z",
};

afterEach(cleanup);

/** The card inside a data router whose root has loaded (the card's compare toggle reads the root's data). */
async function card(pricing: PricingData | null) {
  const router = createMemoryRouter(
    [
      {
        id: "root",
        path: "/",
        loader: () => ({ compare: [] }),
        element: (
          <PricingProvider pricing={pricing}>
            <ListingCard listing={LISTING} href="/listings/x" />
          </PricingProvider>
        ),
      },
    ],
    { hydrationData: { loaderData: { root: { compare: [] } } } },
  );
  render(<RouterProvider router={router} />);
  await screen.findByText("£1,200");
}

describe("prices for a buyer in another currency", () => {
  it("shows the seller's price and the approximation on a card, read as 'about'", async () => {
    await card(PRICING);
    expect(screen.getByText("£1,200")).toBeTruthy();
    const approx = screen.getByTestId("approx-price");
    expect(approx.textContent).toBe("≈ about €1,395");
    // The sign is for the eye; the word for the ear.
    expect(approx.querySelector('[aria-hidden="true"]')!.textContent).toBe("≈ ");
    expect(approx.querySelector(".sr-only")!.textContent).toBe("about ");
  });

  it("shows no approximation in the seller's own currency or without rates", async () => {
    await card({ ...PRICING, display: "GBP" });
    expect(screen.getByText("£1,200")).toBeTruthy();
    expect(screen.queryByTestId("approx-price")).toBeNull();
    cleanup();
    await card(null);
    expect(screen.queryByTestId("approx-price")).toBeNull();
  });

  it("puts both on one line on the listing page", () => {
    render(
      <PricingProvider pricing={PRICING}>
        <Price minor={120_000} currency="GBP" testId="price" />
      </PricingProvider>,
    );
    expect(screen.getByTestId("price").textContent).toBe("£1,200 · , ≈ about €1,395");
  });

  it("adds only the approximation beside a shipping cost, and none to a free one", () => {
    render(
      <PricingProvider pricing={PRICING}>
        <p data-testid="parcel">
          <ApproxPrice minor={3_900} currency="GBP" />
        </p>
        <p data-testid="free">
          <ApproxPrice minor={0} currency="GBP" />
        </p>
      </PricingProvider>,
    );
    // £39 / 0.86 = €45.35 → €45.
    expect(screen.getByTestId("parcel").textContent).toBe("≈ about €45");
    expect(screen.getByTestId("free").textContent).toBe("");
  });
});
