// @vitest-environment happy-dom
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { Plots } from "~/listings/ui/Plots";
import type { PlotSet, ResponsePlot } from "~/listings/types";

// The listing's plots as the server sends them: every plot an SVG image with its name, no chart
// library, no placeholder waiting for script.
function serverRender(plots: PlotSet): HTMLElement {
  const host = document.createElement("div");
  host.innerHTML = renderToStaticMarkup(<Plots plots={plots} />);
  return host;
}

const riaa: ResponsePlot = {
  id: "response-0",
  title: "Phono equalisation against the RIAA curve",
  conditions: "as typed",
  kind: "riaa",
  fromCapture: false,
  points: [20, 100, 1000, 10_000, 20_000].map((f, i) => ({
    f,
    level: [19.3, 13.1, 0, -13.7, -19.6][i],
    target: [19.27, 13.09, 0, -13.73, -19.62][i],
    deviation: [0.03, 0.01, 0, 0.03, 0.02][i],
  })),
  riaa: { variant: "RIAA (IEC 60098)", worst: "+0.03 dB at 20 Hz" },
  domain: { level: [-25, 25], deviation: [-1, 1] },
};

describe("the listing's plots", () => {
  it("draws an RIAA sweep as the measured level over the dashed curve, and the deviation beneath", () => {
    const host = serverRender({ spectra: [], squares: [], responses: [riaa], impedances: [], speedDrifts: [] });
    const images = [...host.querySelectorAll('[role="img"]')];
    expect(images.map((i) => i.getAttribute("aria-label"))).toEqual([
      "Phono equalisation against the RIAA curve",
      "Phono equalisation against the RIAA curve: deviation from the curve",
    ]);
    const [curve, measured] = [...images[0].querySelectorAll("path[data-series]")];
    expect(curve.getAttribute("data-series")).toBe("response-0-target");
    expect(curve.getAttribute("stroke-dasharray")).toBeTruthy();
    expect(measured.getAttribute("data-series")).toBe("response-0-level");
    expect(images[1].querySelectorAll("path[data-series]")).toHaveLength(1);
    expect(images[0].textContent).toContain("Level re 1 kHz (dB)");
    expect(images[1].textContent).toContain("Deviation (dB)");
    expect(host.innerHTML).not.toContain("recharts");
  });
  it("draws a wow & flutter capture as speed against time, with a firm line at nominal and the weighted figures", () => {
    const points = Array.from({ length: 50 }, (_, i) => ({ t: i * 0.2, percent: 0.1 + 0.05 * Math.sin(i) }));
    const host = serverRender({
      spectra: [],
      squares: [],
      responses: [],
      impedances: [],
      speedDrifts: [
        {
          id: "speed-0",
          title: "Speed drift",
          conditions: "3150 Hz test tone, 33⅓ rpm",
          points,
          figures: [{ label: "Wow & flutter, weighted peak (IEC 60386, two-sigma)", display: "±0.050 %" }],
        },
      ],
    });
    const [image] = [...host.querySelectorAll('[role="img"]')];
    expect(image.getAttribute("aria-label")).toBe("Speed drift: speed against time");
    expect(image.textContent).toContain("Speed re nominal (%)");
    expect(image.textContent).toContain("Time (s)");
    // The axis reaches 0 %, so the trace sits visibly above nominal (0.05–0.15 % fast).
    expect([...image.querySelectorAll("span")].map((s) => s.textContent)).toContain("0");
    expect(host.querySelector("figure")?.textContent).toContain("±0.050 %");
  });
  it("shows nothing when the sheet has nothing to plot", () => {
    expect(serverRender({ spectra: [], squares: [], responses: [], impedances: [], speedDrifts: [] }).innerHTML).toBe("");
  });
});
