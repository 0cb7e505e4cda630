// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router";
import { http, HttpResponse } from "msw";
import { setupServer } from "msw/node";
import { InventoryView } from "~/inventory/ui/InventoryView";
import type { InventoryPage, InventoryRowView } from "@shared/inventory";

// The inventory's react-query client against a mocked inventory API: an inline price and a bulk
// withdrawal show at once, before the server answers; a refusal puts the rows back as they were and
// says why.

const server = setupServer();
const A = "aaaaaaaa-0000-4000-8000-00000000000a";
const B = "bbbbbbbb-0000-4000-8000-00000000000b";

const row = (id: string, title: string, priceMinor: number): InventoryRowView => ({
  id,
  reference: null,
  title,
  maker: title.split(" ")[0],
  model: title.split(" ")[1],
  category: "integrated_amplifier",
  status: "live",
  heldReason: null,
  benchVerified: false,
  priceMinor,
  currency: "EUR",
  handlingDays: 3,
  updatedAt: "2026-12-01T10:00:00.000Z",
  coverUrl: null,
  counts: null,
});
const PAGE: InventoryPage = {
  rows: [row(A, "Kelloran ZK 7.0", 124_900), row(B, "Vantrell Velt", 80_000)],
  total: 2,
  page: 1,
  pageCount: 1,
  stateCounts: { draft: 0, held: 0, live: 2, reserved: 0, sold: 0, withdrawn: 0 },
};

/** The server's answer waits until the test lets it go, so the optimistic state can be seen. */
function gate() {
  let open!: () => void;
  const opened = new Promise<void>((r) => (open = r));
  return { open, opened };
}

function mount() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: 60_000 }, mutations: { retry: false } } });
  const router = createMemoryRouter([{ path: "/sell", element: <InventoryView first={{ page: PAGE, params: "" }} actionData={null} /> }], {
    initialEntries: ["/sell"],
  });
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

const rowOf = (id: string) => within(document.querySelector(`tr[data-listing="${id}"]`) as HTMLElement);
const priceOf = (id: string) => document.querySelector(`tr[data-listing="${id}"] [data-price]`)?.getAttribute("data-price");

beforeAll(() => server.listen({ onUnhandledRequest: "error" }));
afterEach(() => {
  cleanup();
  server.resetHandlers();
});
afterAll(() => server.close());

describe("InventoryView", () => {
  it("shows an inline price at once and puts the old one back when the server refuses", async () => {
    const answer = gate();
    const sent: unknown[] = [];
    server.use(
      http.post("*/api/v1/inventory", async ({ request }) => {
        sent.push(await request.json());
        await answer.opened;
        return HttpResponse.json({ error: "sold", message: "Sold; its listing can no longer change." }, { status: 409 });
      }),
      // The refetch after the action never answers here: what the rows show comes from the rollback alone.
      http.get("*/api/v1/inventory", () => new Promise<Response>(() => {})),
    );
    mount();
    await screen.findByText("Kelloran ZK 7.0");
    fireEvent.click(screen.getByRole("button", { name: "Change the price of Kelloran ZK 7.0" }));
    const input = screen.getByLabelText(/New price of Kelloran ZK 7.0/);
    fireEvent.change(input, { target: { value: "1,100" } });
    fireEvent.keyDown(input, { key: "Enter" });

    await waitFor(() => expect(priceOf(A)).toBe("110000"));
    expect(sent).toEqual([{ action: "price", ids: [A], priceMinor: 110_000 }]);
    answer.open();
    await waitFor(() => expect(priceOf(A)).toBe("124900"));
    await rowOf(A).findByText("Sold; its listing can no longer change.");
    expect(priceOf(B)).toBe("80000");
  });

  it("withdraws the ticked units at once, after the confirmation, and rolls them all back on a refusal", async () => {
    const answer = gate();
    server.use(
      http.post("*/api/v1/inventory", async () => {
        await answer.opened;
        return HttpResponse.json(
          {
            error: "conflict",
            message: "A buyer holds this unit.",
            issues: [{ path: B, message: "Vantrell Velt: a buyer holds this unit." }],
          },
          { status: 409 },
        );
      }),
      // The refetch after the action never answers here: what the rows show comes from the rollback alone.
      http.get("*/api/v1/inventory", () => new Promise<Response>(() => {})),
    );
    mount();
    await screen.findByText("Kelloran ZK 7.0");
    fireEvent.click(screen.getByLabelText("Select every unit on this page"));
    fireEvent.change(screen.getByLabelText("Action"), { target: { value: "withdraw" } });
    fireEvent.click(screen.getByRole("button", { name: "Apply to 2 units" }));
    fireEvent.click(await screen.findByRole("button", { name: "Yes, withdraw 2 units" }));

    await waitFor(() => expect(document.querySelectorAll('tr[data-status="withdrawn"]')).toHaveLength(2));
    answer.open();
    await screen.findByText("Vantrell Velt: a buyer holds this unit.");
    expect(document.querySelectorAll('tr[data-status="live"]')).toHaveLength(2);
  });
});
