// @vitest-environment happy-dom
import fs from "node:fs";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen } from "@testing-library/react";
import { MemoryRouter } from "react-router";
import { Pagination } from "~/components/Pagination";

// The market's pager at either end: the spent direction is text, not a link, and its colour (from the
// theme in app.css, with any /opacity blended over the page) meets WCAG's 4.5:1 for normal text.
const css = fs.readFileSync(path.resolve(import.meta.dirname, "../../app/app.css"), "utf8");
const token = (name: string) => {
  const hex = new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, "i").exec(css)?.[1];
  if (!hex) throw new Error(`no --color-${name} in app.css`);
  return [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
};
const luminance = (rgb: number[]) => {
  const [r, g, b] = rgb.map((v) => (v / 255 <= 0.03928 ? v / 255 / 12.92 : ((v / 255 + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
};
/** Contrast of a Tailwind text class such as `text-ink-faint/70` on the page background. */
function contrastOnPaper(textClass: string): number {
  const [, name, alpha] = /^text-([a-z-]+)(?:\/(\d+))?$/.exec(textClass)!;
  const paper = token("paper");
  const a = alpha ? Number(alpha) / 100 : 1;
  const fg = token(name).map((v, i) => v * a + paper[i] * (1 - a));
  const [hi, lo] = [luminance(fg), luminance(paper)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

function pager(page: number, pageCount: number) {
  return render(
    <MemoryRouter>
      <Pagination page={page} pageCount={pageCount} hrefFor={(p) => `/market?page=${p}`} />
    </MemoryRouter>,
  );
}

afterEach(cleanup);

describe("Pagination", () => {
  it("on the first page, offers Older as a link and shows Newer as legible text", () => {
    const { container } = pager(1, 3);
    expect(screen.getByRole("link", { name: "Older →" }).getAttribute("href")).toBe("/market?page=2");
    expect(screen.queryByRole("link", { name: /Newer/ })).toBeNull();
    const newer = [...container.querySelectorAll("span")].find((s) => s.textContent === "← Newer")!;
    const colour = newer.className.split(/\s+/).find((c) => /^text-[a-z]/.test(c) && !/^text-(xs|sm|base|lg|xl)/.test(c))!;
    expect(contrastOnPaper(colour)).toBeGreaterThanOrEqual(4.5);
  });

  it("on the last page, offers Newer as a link and shows Older as legible text", () => {
    const { container } = pager(3, 3);
    expect(screen.getByRole("link", { name: "← Newer" }).getAttribute("href")).toBe("/market?page=2");
    expect(screen.queryByRole("link", { name: /Older/ })).toBeNull();
    const older = [...container.querySelectorAll("span")].find((s) => s.textContent === "Older →")!;
    const colour = older.className.split(/\s+/).find((c) => /^text-[a-z]/.test(c) && !/^text-(xs|sm|base|lg|xl)/.test(c))!;
    expect(contrastOnPaper(colour)).toBeGreaterThanOrEqual(4.5);
  });

  it("shows nothing for a single page", () => {
    const { container } = pager(1, 1);
    expect(container.innerHTML).toBe("");
  });

  it("words its links Previous and Next where the order is the reader's choice (the inventory sorted by price)", () => {
    render(
      <MemoryRouter>
        <Pagination
          page={2}
          pageCount={3}
          hrefFor={(p) => `/sell?sort=price&page=${p}`}
          labels={{ previous: "← Previous", next: "Next →" }}
        />
      </MemoryRouter>,
    );
    expect(screen.getByRole("link", { name: "← Previous" }).getAttribute("href")).toBe("/sell?sort=price&page=1");
    expect(screen.getByRole("link", { name: "Next →" }).getAttribute("href")).toBe("/sell?sort=price&page=3");
    expect(screen.queryByText(/Newer|Older/)).toBeNull();
  });
});
