// @vitest-environment happy-dom
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { Plots } from "~/listings/ui/Plots";
import type { ImpedancePlot } from "~/listings/types";

// A loudspeaker's impedance plot as the server sends it: an SVG image with its name and its words,
// the modulus over the 80 % line of the rated impedance, the phase beneath when the sweep has it.
function render(impedances: ImpedancePlot[]): HTMLElement {
  const host = document.createElement("div");
  host.innerHTML = renderToStaticMarkup(<Plots plots={{ spectra: [], responses: [], squares: [], impedances, speedDrifts: [] }} />);
  return host;
}

const plot = (phase: boolean, floorOhm: number | null): ImpedancePlot => ({
  id: "impedance-0",
  title: "Impedance against frequency",
  conditions: "5 points, 20 Hz–20 kHz, from a capture",
  points: [20, 50, 300, 3000, 20_000].map((f, i) => ({
    f,
    ohms: [9.1, 36, 6.6, 7.4, 14][i],
    ...(phase ? { phase: [40, 0, -12, 20, 45][i] } : {}),
  })),
  floorOhm,
  figures: [{ label: "Minimum within 20 Hz–20 kHz", display: "6.6 Ω at 300 Hz" }],
});

describe("the listing's impedance plot", () => {
  it("draws modulus, the 80 % floor and the phase, and says them in words", () => {
    const host = render([plot(true, 6.4)]);
    const images = host.querySelectorAll('[role="img"]');
    expect([...images].map((i) => i.getAttribute("aria-label"))).toEqual([
      "Impedance against frequency",
      "Impedance against frequency: phase",
    ]);
    expect(host.querySelector('[data-series="modulus"]')).not.toBeNull();
    expect(host.querySelector('[data-series="floor"]')).not.toBeNull();
    expect(host.querySelector('[data-series="phase"]')).not.toBeNull();
    expect(host.textContent).toContain("lowest 6.6 Ω at 300 Hz, highest 36 Ω at 50 Hz.");
    expect(host.textContent).toContain("80 % of the rated impedance: 6.4 Ω.");
    expect(host.textContent).toContain("6.6 Ω at 300 Hz");
  });

  it("without phase or a rating: the modulus alone", () => {
    const host = render([plot(false, null)]);
    expect(host.querySelectorAll('[role="img"]').length).toBe(1);
    expect(host.querySelector('[data-series="floor"]')).toBeNull();
    expect(host.querySelector('[data-series="phase"]')).toBeNull();
  });
});
