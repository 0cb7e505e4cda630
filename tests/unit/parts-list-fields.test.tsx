// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { createRoutesStub } from "react-router";
import { RestorationEntryForm } from "~/sell/RestorationEntryForm";
import { TemplateForm } from "~/restoration-templates/ui/TemplateForm";
import type { RestorationTemplateView } from "@shared/restoration-template";

// The parts rows a log entry and a restoration template share: what the workshop typed comes back
// after a refusal with the error beside its field, stored parts fill the rows, and spare rows are there
// without JavaScript.

afterEach(cleanup);

const inputs = (field: "quantity" | "part" | "reference") =>
  [...document.querySelectorAll<HTMLInputElement>(`input[name$=".${field}"][name^="parts."]`)].map((i) => i.value);

const RECAP: RestorationTemplateView = {
  id: "00000000-0000-4000-8000-000000000001",
  title: "Full recap",
  work: "Replaced every electrolytic capacitor.",
  parts: [{ quantity: 4, part: "Electrolytic capacitor 470 µF 50 V", reference: "C501–C504" }],
};

function show(element: React.ReactElement) {
  const Stub = createRoutesStub([{ path: "/", Component: () => element }]);
  render(<Stub initialEntries={["/"]} />);
}

describe("parts rows", () => {
  it("give back a refused log entry's typed parts in their places, the error beside the row it names", () => {
    show(
      <RestorationEntryForm
        busy={false}
        values={{ "parts.0.quantity": "2", "parts.0.part": "Filter capacitor", "parts.3.quantity": "x", "parts.3.part": "Bias trimmer" }}
        errors={{ "parts.3.quantity": "A whole number from 1 to 999." }}
      />,
    );
    // Rows 0–3 as posted (1 and 2 left blank), then the entry form's two spare rows.
    expect(inputs("part")).toEqual(["Filter capacitor", "", "", "Bias trimmer", "", ""]);
    expect(inputs("quantity")).toEqual(["2", "", "", "x", "", ""]);
    const quantity = document.querySelector<HTMLInputElement>('input[name="parts.3.quantity"]')!;
    expect(quantity.getAttribute("aria-invalid")).toBe("true");
    expect(quantity.closest("label")?.textContent).toContain("A whole number from 1 to 999.");
  });

  it("show a template's stored parts, then three spare rows, and add three more on request", () => {
    show(<TemplateForm busy={false} template={RECAP} />);
    expect(inputs("quantity")).toEqual(["4", "", "", ""]);
    expect(inputs("reference")).toEqual(["C501–C504", "", "", ""]);
    fireEvent.click(screen.getByRole("button", { name: "Add part rows" }));
    expect(inputs("part")).toHaveLength(7);
  });
});
