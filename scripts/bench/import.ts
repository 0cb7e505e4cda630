// `npm run bench -- --only import`: a workshop's 5,000-unit CSV through the served app as a workshop sends
// it: POST /api/v1/imports (the whole file read and checked, the import queued), then the worker's
// listing-import job writing the drafts in one transaction, polled through GET /api/v1/imports/:id the
// way the import page does. The figure is the time from the upload to the status saying done.
import { INVENTORY_COLUMNS, inventoryCsv, type InventoryRow } from "../../shared/inventory-csv";
import { ms, type Figure, type ServedApp } from "./served-app";

const ROWS = 5000;

/** Invented units, half amplifiers with three figures, half turntables with a speed error, all different. */
function benchCsv(): string {
  const rows: InventoryRow[] = [];
  for (let n = 1; n <= ROWS; n++) {
    const cells: InventoryRow = Object.fromEntries(INVENTORY_COLUMNS.map((c) => [c, ""]));
    Object.assign(cells, {
      reference: `BN-${n}`,
      maker: n % 3 ? "Vantrell" : "Pellquist",
      model: `Bench ${n}`,
      era: `${1970 + (n % 20)}`,
      cosmetic_grade: n % 4 ? "clean" : "lived_in",
      service_state: "serviced_measured",
      description: "Serviced: contacts cleaned, electrolytics in the supply replaced, measured after warm-up.",
      price: `${300 + (n % 900)}.00`,
      currency: "EUR",
      handling_days: "3",
      weight_kg: "9.5",
      country: "DE",
      measured_on: "2026-11-20",
      measured_by: "Bench 1",
    });
    if (n % 2)
      Object.assign(cells, {
        category: "integrated_amplifier",
        power: `2 × ${40 + (n % 60)} W`,
        power_load: "8 Ω",
        power_limit: "0.1 % THD",
        power_driven: "both",
        thd: "0.03 %",
        thd_level: "1 W",
        thd_load: "8 Ω",
        thd_frequency: "1 kHz",
        dc_offset: `${n % 20} mV`,
      });
    else Object.assign(cells, { category: "turntable", speed_error: "+0.2 %", speed_error_speed: "33⅓ rpm" });
    rows.push(cells);
  }
  return inventoryCsv(rows);
}

export async function importFigures(app: ServedApp): Promise<{ figures: Figure[]; notes: string[] }> {
  const { base } = app;
  const signIn = await fetch(`${base}/sign-in`, {
    method: "POST",
    redirect: "manual",
    headers: { Origin: base, "Content-Type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email: "workshop@loadline.test", password: "bench-demo-2026", redirectTo: "/sell" }),
  });
  const cookie = (signIn.headers.getSetCookie().find((c) => c.startsWith("loadline_session=")) ?? "").split(";")[0];
  if (!cookie) throw new Error(`sign-in as the demo workshop failed (${signIn.status})`);
  const text = benchCsv();
  const form = new FormData();
  form.set("file", new Blob([text], { type: "text/csv" }), "bench-5000.csv");

  const started = performance.now();
  const res = await fetch(`${base}/api/v1/imports`, { method: "POST", headers: { Cookie: cookie, Origin: base }, body: form });
  const uploaded = performance.now() - started;
  const server = Number(/app;dur=([\d.]+)/.exec(res.headers.get("Server-Timing") ?? "")?.[1] ?? NaN);
  if (res.status !== 202) throw new Error(`the import was refused (${res.status}): ${(await res.text()).slice(0, 300)}`);
  const { import: queued } = (await res.json()) as { import: { id: string } };
  let status = "queued";
  let error: string | null = null;
  while (status === "queued" || status === "running") {
    if (performance.now() - started > 120_000) throw new Error("the import did not finish within 2 minutes");
    await new Promise((r) => setTimeout(r, 200));
    const body = (await (await fetch(`${base}/api/v1/imports/${queued.id}`, { headers: { Cookie: cookie } })).json()) as {
      import: { status: string; error: string | null };
    };
    ({ status, error } = body.import);
  }
  if (status !== "done") throw new Error(`the import failed: ${error}`);
  const total = performance.now() - started;
  const mb = (Buffer.byteLength(text) / 1048576).toFixed(2);
  return {
    figures: [
      {
        label: `CSV import: upload of ${ROWS.toLocaleString("en")} rows (${mb} MB) read and checked, server time (round trip ${ms(uploaded)} ms)`,
        value: ms(server),
        unit: "ms",
      },
      {
        label: `CSV import: ${ROWS.toLocaleString("en")} rows from upload to all drafts written (job, polled every 200 ms)`,
        value: Math.round(total / 100) / 10,
        unit: "s",
        limit: 20,
      },
    ],
    notes: [],
  };
}
