// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { cleanup, configure, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { http, HttpResponse, type JsonBodyType } from "msw";
import { setupServer } from "msw/node";
import { counts, mountMarket, page, unit } from "./market-fixtures";

// The market's filter panel against a mocked /api/v1/listings: what it asks for, what it shows while it
// waits, and how it follows the URL.

// The machine is shared: give answers time to arrive (this waits for a state, it asserts no timing).
configure({ asyncUtilTimeout: 5000 });

const server = setupServer();
/** The query strings the panel sent, in order. */
const asked: string[] = [];

/** Answers every listings request with `answer(params)`; `hold` keeps answers back until released. */
function api(answer: (params: URLSearchParams) => { status?: number; body: JsonBodyType }, { hold = false } = {}) {
  let release!: () => void;
  const gate = hold ? new Promise<void>((r) => (release = r)) : Promise.resolve();
  server.use(
    http.get("*/api/v1/listings", async ({ request }) => {
      const params = new URL(request.url).searchParams;
      asked.push(params.toString());
      await gate;
      const { status = 200, body } = answer(params);
      return HttpResponse.json(body, { status });
    }),
  );
  return () => release();
}

const AMPS = "category=integrated-amplifiers";
const first = page([unit("Orrin A-60"), unit("Orrin A-100")], { counts: counts({ condition: { clean: 3 } }) });
/** The results' status line (the cards carry status lines of their own). */
const resultsStatus = () => within(screen.getByRole("region", { name: "Units for sale" })).getAllByRole("status")[0];
const titles = () => screen.queryAllByRole("heading", { level: 3 }).map((h) => h.textContent);
const field = (label: string | RegExp) => screen.getByLabelText<HTMLInputElement>(label);
/** Types as a person does, one keystroke at a time. */
function typeInto(input: HTMLInputElement, text: string) {
  for (let i = 1; i <= text.length; i++) fireEvent.change(input, { target: { value: text.slice(0, i) } });
}

beforeAll(() => server.listen({ onUnhandledRequest: "error" }));
afterEach(() => {
  cleanup();
  server.resetHandlers();
  asked.length = 0;
});
afterAll(() => server.close());

describe("the market's filter panel", () => {
  it("shows the loader's page without asking the API, then asks with the canonical parameters once typing pauses", async () => {
    api(() => ({ body: page([unit("Orrin A-100")]) }));
    const router = mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    expect(titles()).toEqual(["Orrin A-60", "Orrin A-100"]);
    typeInto(field("Power into 8 Ω, at least"), "100W");
    await waitFor(() => expect(asked).toEqual([`${AMPS}&power8Min=100+W`]));
    expect(router.state.location.search).toBe(`?${AMPS}&power8Min=100+W`);
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100"]));
    // What was typed stays as typed.
    expect(field("Power into 8 Ω, at least").value).toBe("100W");
  });

  it("keeps the previous results, dimmed and marked as updating, while the next arrive", async () => {
    const release = api(() => ({ body: page([unit("Orrin A-100")], { total: 1 }) }), { hold: true });
    mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    const results = screen.getByRole("region", { name: "Units for sale" });
    expect(resultsStatus().textContent).toBe("2 units match");
    typeInto(field("THD, at most"), "0.05 %");
    await waitFor(() => expect(asked).toHaveLength(1));
    expect(asked[0]).toBe(`${AMPS}&thdMax=0.05+%25`);
    expect(titles()).toEqual(["Orrin A-60", "Orrin A-100"]);
    expect(results.getAttribute("aria-busy")).toBe("true");
    expect(resultsStatus().textContent).toContain("Updating…");
    release();
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100"]));
    expect(results.getAttribute("aria-busy")).toBe("false");
    expect(resultsStatus().textContent).toBe("1 unit matches");
  });

  it("says which filters to loosen when nothing matches", async () => {
    api(() => ({ body: page([], { total: 0, counts: counts({ condition: { clean: 0, rough: 2 } }) }) }));
    mountMarket(`/market?${AMPS}&condition=clean`, { params: `${AMPS}&condition=clean`, page: first });
    typeInto(field("Power into 8 Ω, at least"), "500 W");
    const empty = await screen.findByRole("heading", { name: "No integrated amplifiers match" });
    const box = within(empty.parentElement!);
    expect(box.getByText("Loosen one of these filters, or clear them all:")).toBeTruthy();
    const remove = box.getByRole("link", { name: "Remove Power into 8 Ω ≥ 500 W" });
    expect(remove.getAttribute("href")).toBe(`/market?${AMPS}&condition=clean`);
    // Without "Clean" the counts say how many units there would be (every other grade's count).
    expect(box.getByRole("link", { name: /^Remove Clean/ }).textContent).toContain("4 without it");
    expect(box.getByRole("link", { name: "Clear all" }).getAttribute("href")).toBe(`/market?${AMPS}`);
  });

  it("shows how many units each choice leaves, and updates the counts with the results", async () => {
    api(() => ({
      body: page([unit("Orrin A-100")], { counts: counts({ condition: { clean: 1 }, measured: { power8: 1 }, verified: 1 }) }),
    }));
    mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    expect(screen.getByRole("checkbox", { name: "Clean 3 units" })).toBeTruthy();
    expect(screen.getByRole("checkbox", { name: "Bench-verified units only 3 units" })).toBeTruthy();
    const hint = () => document.getElementById(field("Power into 8 Ω, at least").getAttribute("aria-describedby")!)!.textContent;
    expect(hint()).toBe("e.g. 80 W · 4 units measured");
    typeInto(field("Power into 8 Ω, at least"), "100 W");
    await screen.findByRole("checkbox", { name: "Clean 1 unit" });
    expect(screen.getByRole("checkbox", { name: "Bench-verified units only 1 unit" })).toBeTruthy();
    expect(hint()).toBe("e.g. 80 W · 1 unit left");
  });

  it("shows the API's refusal beside the field it names, and keeps the last results", async () => {
    api(() => ({
      status: 400,
      body: {
        error: "invalid",
        message: "Some parameters are not right.",
        issues: [{ path: "thdnMax", message: "THD+N is a ratio: at most 100 %." }],
      },
    }));
    mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    const input = field("THD+N, at most");
    typeInto(input, "0.5 %");
    const message = await screen.findByText("THD+N is a ratio: at most 100 %.");
    expect(input.getAttribute("aria-invalid")).toBe("true");
    expect(input.getAttribute("aria-describedby")?.split(" ")).toContain(message.closest("p")!.id);
    expect(titles()).toEqual(["Orrin A-60", "Orrin A-100"]);
    // Not sent again by itself: a refused request stays refused.
    expect(asked).toHaveLength(1);
  });

  it("shows a value it cannot read beside its field, and does not ask the API with it", async () => {
    api(() => ({ body: page([]) }));
    const router = mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    const input = field("Power into 8 Ω, at least");
    typeInto(input, "loud");
    await waitFor(() => expect(input.getAttribute("aria-invalid")).toBe("true"));
    expect(screen.getByRole("alert").textContent).not.toBe("");
    await new Promise((r) => setTimeout(r, 500));
    expect(asked).toEqual([]);
    expect(router.state.location.search).toBe(`?${AMPS}`);
  });

  it("follows back and forward: fields, choices and results as they were", async () => {
    api((p) => ({ body: page([unit(p.has("condition") ? "Orrin A-100 (clean)" : p.has("power8Min") ? "Orrin A-100" : "Other")]) }));
    const router = mountMarket(`/market?${AMPS}`, { params: AMPS, page: first });
    typeInto(field("Power into 8 Ω, at least"), "100 W");
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100"]));
    fireEvent.click(screen.getByRole("checkbox", { name: /^Clean/ }));
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100 (clean)"]));
    expect(router.state.location.search).toBe(`?${AMPS}&condition=clean&power8Min=100+W`);

    await router.navigate(-1);
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100"]));
    expect(screen.getByRole<HTMLInputElement>("checkbox", { name: /^Clean/ }).checked).toBe(false);
    expect(field("Power into 8 Ω, at least").value).toBe("100 W");

    await router.navigate(-1);
    await waitFor(() => expect(titles()).toEqual(["Orrin A-60", "Orrin A-100"]));
    expect(field("Power into 8 Ω, at least").value).toBe("");

    await router.navigate(1);
    await waitFor(() => expect(field("Power into 8 Ω, at least").value).toBe("100 W"));
    await waitFor(() => expect(titles()).toEqual(["Orrin A-100"]));
    // Every answer came from the cache: two filter changes, two requests.
    expect(asked).toHaveLength(2);
  });

  it("loads more with the cursor of the last page, after the cards already shown", async () => {
    api((p) => ({
      body: page([unit("Orrin A-120")], {
        total: 3,
        counts: counts({ condition: { clean: 9 } }),
        nextCursor: p.get("cursor") === "c1" ? null : "c2",
      }),
    }));
    mountMarket(`/market?${AMPS}`, { params: AMPS, page: page([unit("Orrin A-60"), unit("Orrin A-100")], { total: 3, nextCursor: "c1" }) });
    fireEvent.click(await screen.findByRole("button", { name: "Load more of 3 units" }));
    await waitFor(() => expect(titles()).toEqual(["Orrin A-60", "Orrin A-100", "Orrin A-120"]));
    expect(asked).toEqual([`${AMPS}&cursor=c1`]);
    expect(screen.queryByRole("button", { name: /Load more/ })).toBeNull();
    // The counts shown are the first page's (for the whole search), whatever a later page repeats.
    expect(screen.getByRole("checkbox", { name: "Clean 1 unit" })).toBeTruthy();
  });

  it("without JavaScript it is a GET form to the market with every field named", () => {
    mountMarket(`/market?${AMPS}&power8Min=100+W`, { params: `${AMPS}&power8Min=100+W`, page: first });
    const form = screen.getByRole("form", { name: "Filters" });
    expect(form.getAttribute("method")).toBe("get");
    expect(form.getAttribute("action")).toBe("/market");
    const sent = new URLSearchParams([...new FormData(form as HTMLFormElement)].map(([k, v]) => [k, String(v)]));
    expect(sent.get("category")).toBe("integrated-amplifiers");
    expect(sent.get("power8Min")).toBe("100 W");
    expect(screen.getByRole("link", { name: "Save these filters as an alert" }).getAttribute("href")).toBe(
      `/alerts/new?${AMPS}&power8Min=100+W`,
    );
  });
});
