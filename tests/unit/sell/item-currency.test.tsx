// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { http, HttpResponse } from "msw";
import { setupServer } from "msw/node";
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { createMemoryRouter, RouterProvider } from "react-router";
import { ItemForm } from "~/sell/ItemForm";
import { itemFormValues } from "@shared/listing-draft";

// The item step's currency follows the country the seller picks (sterling for the United Kingdom,
// Swedish kronor for Sweden), until the seller picks a currency of their own.

// A change still waiting when the form unmounts is sent straight away (keepalive): answered here.
const server = setupServer(http.patch("*/api/v1/listings/:id", () => HttpResponse.json({})));
beforeAll(() => server.listen({ onUnhandledRequest: "error" }));
afterEach(cleanup);
afterAll(() => server.close());

const LISTING = "aaaaaaaa-0000-4000-8000-0000000000c1";

function mount(country: string | null, currency: string) {
  const values = itemFormValues({ category: "integrated_amplifier", country, currency });
  const router = createMemoryRouter(
    [
      {
        path: "/",
        HydrateFallback: () => null,
        Component: () => <ItemForm listingId={LISTING} values={values} published={false} busy={false} />,
      },
      // The autosave's PATCH lands here; what it answers does not matter to these tests.
      { path: "/api/v1/listings/:id", action: () => ({}) },
    ],
    { initialEntries: ["/"] },
  );
  render(<RouterProvider router={router} />);
}

const select = (label: string) => screen.getByLabelText<HTMLSelectElement>(label);

describe("the item step's currency", () => {
  it("follows the country until the seller chooses one", async () => {
    mount(null, "EUR");
    await screen.findByRole("form", { name: "Item details" });
    expect(select("Currency").value).toBe("EUR");

    fireEvent.change(select("Country"), { target: { value: "GB" } });
    expect(select("Currency").value).toBe("GBP");
    fireEvent.change(select("Country"), { target: { value: "SE" } });
    expect(select("Currency").value).toBe("SEK");

    // The seller's own choice stays when the country changes again.
    fireEvent.change(select("Currency"), { target: { value: "USD" } });
    fireEvent.change(select("Country"), { target: { value: "DE" } });
    expect(select("Currency").value).toBe("USD");
  });

  it("starts from a draft's country and currency as saved", async () => {
    mount("GB", "GBP");
    await screen.findByRole("form", { name: "Item details" });
    fireEvent.change(select("Country"), { target: { value: "IE" } });
    expect(select("Currency").value).toBe("EUR");
  });
});
