// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { createMemoryRouter, redirect, RouterProvider, useLoaderData } from "react-router";
import { RestorationLogStep } from "~/sell/RestorationLogStep";
import type { RestorationEntryView } from "@shared/restoration-form";

// "Add to the log" with JavaScript on: the page's action answers as the real one does (a redirect to
// the step with the new entry's id), the entry shows in the log, and the form is empty again with its
// first field focused, so a second press cannot post the same entry twice.

afterEach(cleanup);

const LISTING = "aaaaaaaa-0000-4000-8000-0000000000b1";

function mount() {
  const log: RestorationEntryView[] = [];
  const posted: string[] = [];
  const router = createMemoryRouter(
    [
      {
        path: "/sell/:id/restoration",
        loader: () => ({ log: [...log] }),
        HydrateFallback: () => null,
        action: async ({ request }) => {
          const form = await request.formData();
          posted.push(String(form.get("work")));
          const id = `bbbbbbbb-0000-4000-8000-00000000000${log.length + 1}`;
          log.push({
            id,
            doneOn: String(form.get("doneOn")),
            work: String(form.get("work")),
            technician: null,
            parts: [],
            readingsBefore: [],
            readingsAfter: [],
          });
          return redirect(`/sell/${LISTING}/restoration?added=${id}`);
        },
        Component: function Step() {
          const { log } = useLoaderData<{ log: RestorationEntryView[] }>();
          return <RestorationLogStep listingId={LISTING} restoration={log} failure={null} />;
        },
      },
    ],
    { initialEntries: [`/sell/${LISTING}/restoration`] },
  );
  render(<RouterProvider router={router} />);
  return posted;
}

describe("adding a restoration log entry", () => {
  it("clears the form and focuses its first field once the entry is added", async () => {
    const posted = mount();
    const form = await screen.findByRole("form", { name: "New log entry" });
    const date = () => form.querySelector<HTMLInputElement>('input[name="doneOn"]')!;
    const work = () => screen.getByRole("form", { name: "New log entry" }).querySelector<HTMLTextAreaElement>('textarea[name="work"]')!;
    fireEvent.change(date(), { target: { value: "2026-11-20" } });
    fireEvent.change(work(), { target: { value: "Replaced the main filter capacitors." } });
    fireEvent.click(screen.getByRole("button", { name: "Add to the log" }));

    await screen.findByRole("status");
    expect(screen.getByRole("status").textContent).toMatch(/Added to the log/);
    expect(screen.getByText("Replaced the main filter capacitors.")).toBeTruthy();
    await waitFor(() => expect(work().value).toBe(""));
    const fresh = screen.getByRole("form", { name: "New log entry" }).querySelector<HTMLInputElement>('input[name="doneOn"]')!;
    expect(fresh.value).toBe("");
    expect(document.activeElement).toBe(fresh);

    // A second press now posts an empty form, not the same entry again (the real action refuses it).
    expect(posted).toEqual(["Replaced the main filter capacitors."]);
  });
});
