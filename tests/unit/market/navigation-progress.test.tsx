// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { createMemoryRouter, Link, Outlet, RouterProvider } from "react-router";
import { NavigationProgress, useNavigating } from "~/components/NavigationProgress";

// Moving to a page whose data is slow: the bar shows and the page says it is busy until the page arrives.

function Shell() {
  const navigating = useNavigating();
  return (
    <>
      <NavigationProgress />
      <div id="main" data-testid="main" aria-busy={navigating || undefined}>
        <Link to="/slow">Slow page</Link>
        <Outlet />
      </div>
    </>
  );
}

afterEach(cleanup);

describe("page-change progress", () => {
  it("shows a bar and marks the page busy while the next page loads", async () => {
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const router = createMemoryRouter(
      [
        {
          path: "/",
          element: <Shell />,
          children: [
            { index: true, element: <p>Home</p> },
            {
              path: "slow",
              loader: async () => {
                await gate;
                return null;
              },
              element: <p>Arrived</p>,
            },
          ],
        },
      ],
      { initialEntries: ["/"] },
    );
    const { container } = render(<RouterProvider router={router} />);
    const bar = () => container.querySelector(".navigation-progress");
    expect(bar()).toBeNull();
    expect(screen.getByTestId("main").getAttribute("aria-busy")).toBeNull();
    fireEvent.click(screen.getByRole("link", { name: "Slow page" }));
    await waitFor(() => expect(bar()).not.toBeNull());
    expect(screen.getByTestId("main").getAttribute("aria-busy")).toBe("true");
    release();
    await screen.findByText("Arrived");
    expect(bar()).toBeNull();
    expect(screen.getByTestId("main").getAttribute("aria-busy")).toBeNull();
  });
});
