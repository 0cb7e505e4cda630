// @vitest-environment happy-dom
import { renderToStaticMarkup } from "react-dom/server";
import type { ReactElement } from "react";
import { describe, expect, it } from "vitest";
import {
  FrequencyResponsePlot,
  HarmonicSpectrumPlot,
  TracePlot,
  describeResponses,
  type Harmonic,
  type ResponseSeries,
} from "~/components/plots";

// The plots as the server sends them: markup only, no effects, no script.
function serverRender(el: ReactElement): HTMLElement {
  const host = document.createElement("div");
  host.innerHTML = renderToStaticMarkup(el);
  return host;
}

const sweep = (offset: number): ResponseSeries["points"] =>
  [20, 50, 100, 1000, 10_000, 20_000].map((hz) => ({ hz, db: offset + (hz === 20 ? -1.5 : hz === 20_000 ? -0.5 : 0) }));
const units: ResponseSeries[] = [
  { id: "u1", label: "Unit one", points: sweep(0) },
  { id: "u2", label: "Unit two", points: sweep(0.5) },
  { id: "u3", label: "Unit three", points: sweep(-0.25) },
];

describe("frequency-response plot", () => {
  it("draws one trace per series in an SVG, named for screen readers", () => {
    const host = serverRender(<FrequencyResponsePlot title="Frequency response of three units" series={units} />);
    const img = host.querySelector('[role="img"]')!;
    expect(img.getAttribute("aria-label")).toBe("Frequency response of three units");
    expect(img.querySelectorAll("svg path[data-series]")).toHaveLength(3);
    expect([...img.querySelectorAll("svg path[data-series]")].map((p) => p.getAttribute("data-series"))).toEqual(["u1", "u2", "u3"]);
  });
  it("spans the log axis from the first measured frequency to the last", () => {
    const host = serverRender(<FrequencyResponsePlot title="t" series={[units[0]]} yDomain={[-3, 3]} />);
    const d = host.querySelector("path[data-series]")!.getAttribute("d")!;
    const xs = [...d.matchAll(/[ML]([\d.]+) /g)].map((m) => Number(m[1]));
    // 20, 50, 100, 1k, 10k, 20k on a 20 Hz–20 kHz log axis.
    expect(xs).toEqual([0, 132.6, 233, 566.3, 899.7, 1000]);
  });
  it("labels the axes with their units and the frequency ticks the trade's way", () => {
    const host = serverRender(<FrequencyResponsePlot title="t" series={units} yLabel="Level re 1 kHz (dB)" />);
    const text = host.querySelector('[role="img"]')!.textContent;
    expect(text).toContain("Frequency (Hz)");
    expect(text).toContain("Level re 1 kHz (dB)");
    const x = [...host.querySelectorAll('[role="img"] span[style*="left"]')];
    expect(x.map((el) => el.textContent)).toEqual(["20", "50", "100", "200", "500", "1k", "2k", "5k", "10k", "20k"]);
    // On a phone only the decades and the ends keep their labels.
    expect(x.filter((el) => !el.className.includes("max-sm:hidden")).map((el) => el.textContent)).toEqual([
      "20",
      "100",
      "1k",
      "10k",
      "20k",
    ]);
    const y = [...host.querySelectorAll('[role="img"] span[style*="top"]')];
    expect(y.map((el) => el.textContent)).toEqual(["−4", "−2", "0", "2", "4"]);
    // Up is louder: the lowest level sits at the bottom of the plot, the highest at the top.
    expect(y.map((el) => (el as HTMLElement).style.top)).toEqual(["100%", "75%", "50%", "25%", "0%"]);
    expect((x[0] as HTMLElement).style.left).toBe("0%");
    expect((x[5] as HTMLElement).style.left).toBe("56.632%"); // 1 kHz: log(1000 / 20) / log(20000 / 20)
  });
  it("has a legend entry per series, each drawn in its own colour and dash", () => {
    const host = serverRender(<FrequencyResponsePlot title="t" series={[...units, { id: "u4", label: "Unit four", points: sweep(1) }]} />);
    const entries = [...host.querySelectorAll('ul[aria-label="Legend"] li')];
    expect(entries.map((li) => li.textContent)).toEqual(["Unit one", "Unit two", "Unit three", "Unit four"]);
    const looks = [...host.querySelectorAll("svg path[data-series]")].map(
      (p) => `${p.getAttribute("stroke")}|${p.getAttribute("stroke-dasharray")}`,
    );
    expect(new Set(looks).size).toBe(4);
    const swatches = entries.map(
      (li) => `${li.querySelector("path")!.getAttribute("stroke")}|${li.querySelector("path")!.getAttribute("stroke-dasharray")}`,
    );
    expect(swatches).toEqual(looks);
  });
  it("leaves the legend out for a single trace", () => {
    expect(serverRender(<FrequencyResponsePlot title="t" series={[units[0]]} />).querySelector('ul[aria-label="Legend"]')).toBeNull();
  });
  it("draws a reference curve under the measured trace", () => {
    const host = serverRender(
      <FrequencyResponsePlot
        title="t"
        series={[
          { id: "m", label: "Measured", points: sweep(0) },
          { id: "r", label: "RIAA curve", points: sweep(0.1), reference: true },
        ]}
      />,
    );
    const paths = [...host.querySelectorAll("svg path[data-series]")];
    expect(paths.map((p) => p.getAttribute("data-series"))).toEqual(["r", "m"]);
    expect(paths[0].getAttribute("stroke-dasharray")).toBeTruthy();
  });
  it("describes every trace in words the image points to", () => {
    const host = serverRender(<FrequencyResponsePlot title="t" series={units} />);
    const id = host.querySelector('[role="img"]')!.getAttribute("aria-describedby")!;
    const desc = host.ownerDocument.getElementById(id) ?? [...host.querySelectorAll("[id]")].find((e) => e.id === id)!;
    expect(desc.textContent).toBe(describeResponses(units));
    expect(describeResponses([units[1]])).toBe("Unit two: 20 Hz to 20 kHz, lowest −1.00 dB at 20 Hz, highest +0.50 dB at 50 Hz.");
  });
  it("puts the numbers in a table: a row per tick frequency, a column per series", () => {
    const host = serverRender(<FrequencyResponsePlot title="t" series={units} />);
    const table = host.querySelector("details table")!;
    expect([...table.querySelectorAll("thead th")].map((th) => th.textContent)).toEqual([
      "Frequency",
      "Unit one, dB",
      "Unit two, dB",
      "Unit three, dB",
    ]);
    const rows = [...table.querySelectorAll("tbody tr")];
    expect(rows.map((r) => r.querySelector("th")!.textContent)).toEqual([
      "20 Hz",
      "50 Hz",
      "100 Hz",
      "200 Hz",
      "500 Hz",
      "1 kHz",
      "2 kHz",
      "5 kHz",
      "10 kHz",
      "20 kHz",
    ]);
    expect([...rows[0].querySelectorAll("td")].map((td) => td.textContent)).toEqual(["−1.50", "−1.00", "−1.75"]);
  });
});

describe("harmonic spectrum", () => {
  const harmonics: Harmonic[] = [
    { label: "H2", hz: 2000, levels: { left: -90, right: -95 } },
    { label: "H3", hz: 3000, levels: { left: -100 } },
  ];
  const channels = [
    { key: "left", label: "Left" },
    { key: "right", label: "Right" },
  ];
  it("draws a bar per channel and harmonic, rising from the floor", () => {
    const host = serverRender(
      <HarmonicSpectrumPlot title="t" fundamentalHz={1000} harmonics={harmonics} channels={channels} floorDb={-120} />,
    );
    const bars = [...host.querySelectorAll("svg rect[data-series]")];
    expect(bars.map((b) => b.getAttribute("data-series"))).toEqual(["left", "left", "right"]);
    // −90 dB on a −120…0 axis stands a quarter of the way up.
    expect(Number(bars[0].getAttribute("height"))).toBeCloseTo(250, 1);
    expect(Number(bars[0].getAttribute("y")) + Number(bars[0].getAttribute("height"))).toBeCloseTo(1000, 1);
    expect(host.textContent).toContain("Harmonic of 1 kHz");
    expect(host.textContent).toContain("Level re fundamental (dB)");
    expect([...host.querySelectorAll('ul[aria-label="Legend"] li')].map((li) => li.textContent)).toEqual(["Left", "Right"]);
  });
  it("reads out each channel's harmonics", () => {
    const host = serverRender(
      <HarmonicSpectrumPlot title="t" fundamentalHz={1000} harmonics={harmonics} channels={channels} floorDb={-120} />,
    );
    const id = host.querySelector('[role="img"]')!.getAttribute("aria-describedby")!;
    expect([...host.querySelectorAll("[id]")].find((e) => e.id === id)!.textContent).toBe(
      "Left: H2 −90.0 dB, H3 −100.0 dB. Right: H2 −95.0 dB.",
    );
  });
});

describe("trace", () => {
  it("draws the samples as one line on labelled linear axes", () => {
    const points = Array.from({ length: 50 }, (_, i) => ({ x: i, y: i < 25 ? -1 : 1 }));
    const host = serverRender(
      <TracePlot
        title="Square wave"
        points={points}
        x={{ label: "Time (µs)", unit: "µs", domain: [0, 50] }}
        y={{ label: "Level (V)", unit: "V" }}
      />,
    );
    const d = host.querySelector("path[data-series]")!.getAttribute("d")!;
    expect(d.match(/[ML]/g)).toHaveLength(50);
    expect(host.textContent).toContain("Time (µs)");
    expect(host.textContent).toContain("Level (V)");
    expect(host.textContent).toContain("50 samples from 0 to 49 µs; lowest −1 V at 0 µs, highest 1 V at 25 µs.");
  });
});
