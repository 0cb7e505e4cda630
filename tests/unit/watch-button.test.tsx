// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { http, HttpResponse, type JsonBodyType } from "msw";
import { setupServer } from "msw/node";
import { WatchButton } from "~/components/WatchButton";

// The watch button against a mocked API: the new state shows before the server answers, stays when
// the server confirms it, and returns to the saved state with the server's reason when it refuses.

const LISTING = "aaaaaaaa-0000-4000-8000-00000000000a";
const server = setupServer();
const sent: string[] = [];

/** A handler that answers only when the test releases it, so the in-between state can be seen. */
function held(method: "put" | "delete", status: number, body: JsonBodyType) {
  let release!: () => void;
  const gate = new Promise<void>((r) => (release = r));
  server.use(
    http[method]("*/api/v1/watches/:listingId", async ({ request, params }) => {
      sent.push(`${request.method} ${String(params.listingId)}`);
      await gate;
      return HttpResponse.json(body, { status });
    }),
  );
  return release;
}

function mount(watching: boolean) {
  const client = new QueryClient({ defaultOptions: { mutations: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <WatchButton listingId={LISTING} watching={watching} />
    </QueryClientProvider>,
  );
  return () => screen.getByRole("button");
}

beforeAll(() => server.listen({ onUnhandledRequest: "error" }));
afterEach(() => {
  cleanup();
  server.resetHandlers();
  sent.length = 0;
});
afterAll(() => server.close());

describe("WatchButton", () => {
  it("shows the unit as watched at once, and keeps it when the server confirms", async () => {
    const release = held("put", 200, { listingId: LISTING, watching: true });
    const button = mount(false);
    expect(button().getAttribute("aria-pressed")).toBe("false");
    fireEvent.click(button());
    await waitFor(() => expect(sent).toEqual([`PUT ${LISTING}`]));
    // The server has not answered yet.
    expect(button().getAttribute("aria-pressed")).toBe("true");
    expect(button().textContent).toContain("Watching");
    release();
    await waitFor(() => expect(screen.getByRole("status").textContent).toBe("Press again to stop watching."));
    expect(button().getAttribute("aria-pressed")).toBe("true");
  });

  it("rolls back and says why when the server fails (500)", async () => {
    const release = held("put", 500, { error: "server_error", message: "Something went wrong on our side; try again in a moment." });
    const button = mount(false);
    fireEvent.click(button());
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(button().getAttribute("aria-pressed")).toBe("true");
    release();
    await waitFor(() => expect(button().getAttribute("aria-pressed")).toBe("false"));
    expect(button().textContent).toContain("Watch this unit");
    expect(screen.getByRole("status").textContent).toBe("Not saved: Something went wrong on our side; try again in a moment.");
  });

  it("rolls back an unwatch the server refuses (409) and shows the server's reason", async () => {
    const release = held("delete", 409, { error: "conflict", message: "Only units for sale can be watched." });
    const button = mount(true);
    fireEvent.click(button());
    await waitFor(() => expect(sent).toEqual([`DELETE ${LISTING}`]));
    expect(button().getAttribute("aria-pressed")).toBe("false");
    release();
    await waitFor(() => expect(button().getAttribute("aria-pressed")).toBe("true"));
    expect(screen.getByRole("status").textContent).toBe("Not saved: Only units for sale can be watched.");
  });

  it("without JavaScript it is a form that says what it wants", () => {
    mount(true);
    const form = screen.getByRole("button").closest("form")!;
    expect(form.getAttribute("method")).toBe("post");
    expect(new FormData(form).get("intent")).toBe("unwatch");
    expect(new FormData(form).get("listingId")).toBe(LISTING);
  });
});
