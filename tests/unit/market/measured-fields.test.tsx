// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { renderToString } from "react-dom/server";
import { cleanup, fireEvent, screen } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router";
import { countryOptions } from "@shared/countries";
import { MarketExplorer } from "~/catalogue/ui/MarketExplorer";
import { mountMarket, page, unit } from "./market-fixtures";

// Without a category the panel offers every category's figures, folded away: the server's page carries
// only the fields in use (a no-JS visitor picks a category for the rest), and unfolding draws them all.

const first = { params: "", page: page([unit("Orrin A-60")]) };

/** The market's HTML as the server sends it (no effects run). */
function serverHtml(url: string): string {
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
  return renderToString(
    <QueryClientProvider client={new QueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}
const fieldsIn = (html: string) =>
  [...html.matchAll(/<input[^>]*name="(\w+(?:Min|Max))"/g)].map((m) => m[1]).filter((n) => !n.startsWith("price"));

afterEach(cleanup);

describe("the measured-figure fields", () => {
  it("are not in the server's page without a category, save those in use", () => {
    expect(fieldsIn(serverHtml("/market"))).toEqual([]);
    expect(fieldsIn(serverHtml("/market?thdMax=0.1+%25"))).toEqual(["thdMax"]);
  });

  it("are all in the server's page for a category's own figures", () => {
    expect(fieldsIn(serverHtml("/market?category=integrated-amplifiers"))).toEqual(
      expect.arrayContaining(["power8Min", "power4Min", "thdMax", "snrMin", "dampingMin"]),
    );
  });

  it("are drawn for every category once the folded section is opened", () => {
    mountMarket("/market", first);
    expect(screen.queryByLabelText("Power into 8 Ω, at least")).toBeNull();
    const details = screen.getByText("Figures of every category").closest("details")!;
    details.open = true;
    fireEvent(details, new Event("toggle"));
    expect(screen.getByLabelText("Power into 8 Ω, at least")).toBeTruthy();
    expect(screen.getByLabelText("Wow & flutter, at most")).toBeTruthy();
  });
});
