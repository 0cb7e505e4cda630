// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen, within } from "@testing-library/react";
import { createRoutesStub } from "react-router";
import { RemeasureTable } from "~/components/RemeasureTable";
import { ReceivingSafely } from "~/components/cautions/ReceivingSafely";
import { HeavyUnit, isHeavyUnit } from "~/components/cautions/HeavyUnit";
import { ContestForm } from "~/orders/ui/ContestForm";
import { AcceptWithReadingsForm } from "~/orders/ui/AcceptWithReadingsForm";
import { figureField } from "~/orders/readings-form";
import { compareRemeasurement, remeasurableFigures } from "@shared/bench/remeasure";
import { exampleIntegratedAmplifierSheet } from "@shared/bench/examples";

// The audition window's components: the side-by-side table says each pair's outcome in words with a
// shape (never colour alone), the cautions say what keeps a buyer safe, and the forms post without
// JavaScript with the server's errors beside their fields.

afterEach(cleanup);

const sheet = exampleIntegratedAmplifierSheet();
const POWER_8 = sheet.readings[3].conditions;

describe("RemeasureTable", () => {
  const comparison = compareRemeasurement(sheet, {
    readings: [
      { quantity: "output_power", value: 46.2, unit: "W", channel: "left", conditions: POWER_8 },
      { quantity: "output_power", value: 64, unit: "W", channel: "left", conditions: POWER_8 },
      { quantity: "output_power", value: 64, unit: "W", channel: "left", conditions: { ...POWER_8, loadOhm: 6 } },
    ],
  });

  it("sets the listing's and the buyer's figures side by side, with each outcome in words and a shape", () => {
    render(<RemeasureTable comparison={comparison} />);
    const items = screen.getAllByRole("listitem");
    expect(items).toHaveLength(3);
    const [outside, within_, apart] = items;
    expect(within(outside).getByText("66 W")).toBeTruthy();
    expect(within(outside).getByText("46.2 W")).toBeTruthy();
    expect(within(outside).getByText("Outside tolerance")).toBeTruthy();
    expect(outside.textContent).toContain("−1.55 dB (−30 %)");
    expect(outside.textContent).toContain("worse than listed");
    expect(within(within_).getByText("Within tolerance")).toBeTruthy();
    expect(within(apart).getByText("Not comparable")).toBeTruthy();
    expect(apart.textContent).toMatch(/The load differs/);
    // Each mark carries a drawn shape beside its words, hidden from screen readers (the words speak).
    for (const item of items) expect(item.querySelector("svg[aria-hidden='true'] path, svg[aria-hidden='true'] circle")).toBeTruthy();
    expect(screen.getByText("The buyer's figures differ from the bench sheet.")).toBeTruthy();
    expect(screen.getByText(/1 within tolerance, 1 outside, 1 not comparable/)).toBeTruthy();
  });

  it("names each tolerance's source", () => {
    render(<RemeasureTable comparison={comparison} />);
    expect(screen.getAllByText(/Common practice: the supply rails follow the mains/)).toHaveLength(3);
  });
});

describe("cautions", () => {
  it("ReceivingSafely covers mains voltage, condensation, a proper dummy load, outputs, charged capacitors and defers to technicians", () => {
    render(<ReceivingSafely />);
    const box = screen.getByRole("complementary", { name: "Before you switch on or measure" });
    const text = box.textContent ?? "";
    for (const words of [
      /voltage selector/,
      /condensation/,
      /non-inductive/,
      /Never short an output or connect it to ground/,
      /Capacitors stay charged/,
      /qualified technician/,
      /local\s+electrical-safety rules/,
    ])
      expect(text).toMatch(words);
  });

  it("HeavyUnit shows from 30 kg, with freight packing at dispatch and two people at delivery", () => {
    expect(isHeavyUnit(29_999)).toBe(false);
    expect(isHeavyUnit(30_000)).toBe(true);
    expect(isHeavyUnit(null)).toBe(false);
    const { container } = render(<HeavyUnit weightG={29_999} context="checkout" />);
    expect(container.textContent).toBe("");
    cleanup();
    render(<HeavyUnit weightG={32_500} context="dispatch" />);
    expect(screen.getByRole("heading", { name: "Heavy unit (32.5 kg): two people and freight" })).toBeTruthy();
    expect(document.body.textContent).toMatch(/pallet/);
    expect(document.body.textContent).toMatch(/Two people lift it/);
    cleanup();
    render(<HeavyUnit weightG={30_000} context="checkout" />);
    expect(document.body.textContent).toMatch(/Have two people ready/);
    expect(document.body.textContent).toMatch(/local rules/);
  });
});

describe("the forms", () => {
  const figures = remeasurableFigures(sheet);
  function mount(element: React.ReactElement) {
    const Stub = createRoutesStub([{ path: "/purchases/o1", Component: () => element }]);
    return render(<Stub initialEntries={["/purchases/o1"]} />);
  }

  it("ContestForm posts multipart to the page's own action, with a box per sheet figure and errors beside their fields", () => {
    const { container } = mount(
      <ContestForm
        figures={figures}
        errors={{ reason: "Choose what is wrong.", [figureField("readings.3")]: '"46 Hz" is a frequency' }}
        values={{ [figureField("readings.3")]: "46 Hz", note: "Clips early." }}
      />,
    );
    const form = container.querySelector("form")!;
    expect(form.getAttribute("method")).toBe("post");
    expect(form.getAttribute("enctype")).toBe("multipart/form-data");
    expect(form.getAttribute("action")).toBe("/purchases/o1?intent=contest");
    const box = screen.getByLabelText(/^Output power, left/, { selector: `input[name="${figureField("readings.3")}"]` });
    expect((box as HTMLInputElement).value).toBe("46 Hz");
    expect(box.getAttribute("aria-invalid")).toBe("true");
    const described = box.getAttribute("aria-describedby")!.split(" ");
    expect(described.map((id) => document.getElementById(id)?.textContent).join(" ")).toMatch(/is a frequency/);
    expect(screen.getByText("Choose what is wrong.")).toBeTruthy();
    expect(container.querySelector('input[type="file"][name="photos"][multiple]')).toBeTruthy();
    expect(screen.getAllByRole("radio")).toHaveLength(5);
    // The receiving cautions come before the figures.
    const caution = screen.getByRole("complementary", { name: "Before you switch on or measure" });
    expect(caution.compareDocumentPosition(box) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it("AcceptWithReadingsForm posts urlencoded to ?intent=accept with optional boxes", () => {
    const { container } = mount(<AcceptWithReadingsForm figures={figures} />);
    const form = container.querySelector("form")!;
    expect(form.getAttribute("action")).toBe("/purchases/o1?intent=accept");
    expect(form.getAttribute("enctype")).toBeNull();
    expect(container.querySelectorAll(`input[name^="m:"]`)).toHaveLength(figures.length);
    expect(container.querySelector('select[name="x0.quantity"]')).toBeNull();
    expect(screen.getByRole("button", { name: "Accept the unit" })).toBeTruthy();
  });
});
