// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router";
import { http, HttpResponse } from "msw";
import { setupServer } from "msw/node";
import { MASK_NOTE } from "@shared/contact-mask";
import { ThreadView } from "~/messages/ui/ThreadView";
import type { Conversation, ConversationItem } from "~/messages/types";

// The conversation's react-query client against a mocked threads API: a message sent from the box
// goes to the API as JSON and the conversation is fetched again (the answer shows without a reload);
// a refusal is shown beside the box with the text kept; contact details are flagged before sending.

const THREAD = "bbbbbbbb-0000-4000-8000-00000000000b";
const server = setupServer();
const posted: unknown[] = [];

function conversation(items: ConversationItem[]): Conversation {
  return {
    thread: {
      id: THREAD,
      listingId: "aaaaaaaa-0000-4000-8000-00000000000a",
      listingTitle: "Fenwold Acoustics FW-40",
      listingHref: "/listings/aaaaaaaa-0000-4000-8000-00000000000a",
      listingStatus: "live",
      priceMinor: 48_000,
      currency: "EUR",
      role: "buyer",
      otherName: "Oskar",
      canOffer: false,
      masking: true,
    },
    items,
  };
}

const message = (id: string, body: string, fromMe: boolean, minute: number): ConversationItem => ({
  kind: "message",
  id,
  at: `2026-12-30T10:${String(minute).padStart(2, "0")}:00.000Z`,
  fromMe,
  senderName: fromMe ? "You" : "Oskar",
  body,
  masked: false,
});

const first = message("m1", "Yes, it was serviced last spring.", false, 0);

function mount() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter([{ path: "/messages/:threadId", element: <ThreadView initial={conversation([first])} /> }], {
    initialEntries: [`/messages/${THREAD}`],
  });
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

const box = () => screen.getByLabelText(/Write to Oskar/);
const list = () => within(screen.getByTestId("conversation"));

beforeAll(() => server.listen({ onUnhandledRequest: "error" }));
afterEach(() => {
  cleanup();
  server.resetHandlers();
  posted.length = 0;
});
afterAll(() => server.close());

describe("ThreadView", () => {
  it("sends through the API and shows the conversation as the server has it after", async () => {
    let items = [first];
    server.use(
      http.get(`*/api/v1/threads/${THREAD}/messages`, () => HttpResponse.json(conversation(items))),
      http.post(`*/api/v1/threads/${THREAD}/messages`, async ({ request }) => {
        const body = (await request.json()) as { body: string };
        posted.push(body);
        items = [...items, message("m2", body.body, true, 1), message("m3", "Happy to show it running.", false, 2)];
        return HttpResponse.json(
          { message: { id: "m2", body: body.body, masked: false, at: "2026-12-30T10:01:00.000Z" } },
          { status: 201 },
        );
      }),
    );
    mount();
    expect(list().getByText("Yes, it was serviced last spring.")).toBeTruthy();
    fireEvent.change(box(), { target: { value: "Could I hear it before buying?" } });
    fireEvent.click(screen.getByRole("button", { name: "Send" }));
    await waitFor(() => expect(posted).toEqual([{ body: "Could I hear it before buying?" }]));
    // Fetched again after the send: the other side's answer is there too.
    await waitFor(() => expect(list().getByText("Happy to show it running.")).toBeTruthy());
    expect(list().getByText("Could I hear it before buying?")).toBeTruthy();
    expect((box() as HTMLTextAreaElement).value).toBe("");
  });

  it("shows the server's refusal beside the box and keeps the text", async () => {
    server.use(
      http.get(`*/api/v1/threads/${THREAD}/messages`, () => HttpResponse.json(conversation([first]))),
      http.post(`*/api/v1/threads/${THREAD}/messages`, () =>
        HttpResponse.json(
          {
            error: "invalid",
            message: "Keep a message under 4,000 characters.",
            issues: [{ path: "body", message: "Keep a message under 4,000 characters." }],
          },
          { status: 400 },
        ),
      ),
    );
    mount();
    fireEvent.change(box(), { target: { value: "A long story about the transformer." } });
    fireEvent.click(screen.getByRole("button", { name: "Send" }));
    await waitFor(() => expect(screen.getByText("Keep a message under 4,000 characters.")).toBeTruthy());
    expect((box() as HTMLTextAreaElement).value).toBe("A long story about the transformer.");
    expect(box().getAttribute("aria-invalid")).toBe("true");
  });

  it("says before sending that contact details will be hidden, and not for ordinary figures", async () => {
    server.use(http.get(`*/api/v1/threads/${THREAD}/messages`, () => HttpResponse.json(conversation([first]))));
    mount();
    fireEvent.change(box(), { target: { value: "Is it 230 V 50 Hz only?" } });
    expect(screen.queryByText(MASK_NOTE)).toBeNull();
    fireEvent.change(box(), { target: { value: "Text me on 07700 900123" } });
    expect(screen.getByText(MASK_NOTE)).toBeTruthy();
  });
});
