// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen } from "@testing-library/react";
import { UnsafeToConnect } from "~/listings/ui/UnsafeToConnect";
import { checkBenchSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";

// The listing page's plain warning for a unit the bench found unsafe to connect, from the verdict's hazards.

afterEach(cleanup);

describe("UnsafeToConnect", () => {
  it("names each hazard and gives the usual cautions", () => {
    const sheet = exampleIntegratedAmplifierSheet();
    sheet.readings = sheet.readings.map((r) => (r.quantity === "dc_offset" && r.channel === "left" ? { ...r, value: 0.12 } : r));
    const hazards = checkBenchSheet(sheet).hazards.map((h) => ({ title: h.title, detail: h.detail }));
    render(<UnsafeToConnect hazards={hazards} />);
    const box = screen.getByRole("complementary", { name: "Unsafe to connect as it is" });
    expect(box.textContent).toMatch(/No harmful DC at the loudspeaker outputs:.*120 mV is beyond ±50 mV/);
    expect(box.textContent).toMatch(/qualified technician/);
    expect(box.textContent).toMatch(/local electrical-safety rules/);
    expect(screen.getByRole("heading", { name: "Unsafe to connect as it is" })).toBeTruthy();
  });
});
