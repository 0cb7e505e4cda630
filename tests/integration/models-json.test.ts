import { afterAll, describe, expect, it, vi } from "vitest";
import { sequelize } from "~/db.server";
import { BenchSheet } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { createDraft } from "~/listings/drafts.server";
import { checkBenchSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";
import { cleanUp, makeAccount } from "./listing-support";

// JSON columns come out of the models typed and checked: what today's schema reads is handed out as
// such; what was stored in an older shape reads as null, so pages show no figures rather than wrong
// ones and nothing past the model needs a cast.

afterAll(cleanUp);

async function storedSheet() {
  const seller = await makeAccount(`json-${Math.random().toString(36).slice(2, 8)}`);
  const draft = await createDraft(seller.session, "integrated_amplifier");
  const sheet = exampleIntegratedAmplifierSheet();
  const row = await BenchSheet.create({ listingId: draft.id, sheet, verdict: checkBenchSheet(sheet), checkedAt: new Date() });
  return { seller, row };
}

const keySuffix = () => Math.random().toString(36).slice(2, 10);

const reread = async (id: string) => (await BenchSheet.findByPk(id))!;

describe("a bench sheet row", () => {
  it("reads back its sheet and verdict as the bench wrote them", async () => {
    const { row } = await storedSheet();
    const again = await reread(row.id);
    expect(again.sheet?.category).toBe("integrated_amplifier");
    expect(again.sheet?.readings.length).toBe(exampleIntegratedAmplifierSheet().readings.length);
    expect(again.verdict?.counts).toEqual(checkBenchSheet(exampleIntegratedAmplifierSheet()).counts);
  });

  it("reads a sheet stored in a shape the schema no longer takes as null", async () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const { row } = await storedSheet();
    await sequelize.query(`UPDATE bench_sheets SET sheet = jsonb_set(sheet, '{readings,0,quantity}', '"warp_factor"') WHERE id = :id`, {
      replacements: { id: row.id },
    });
    expect((await reread(row.id)).sheet).toBeNull();
    expect(warn.mock.calls.some(([m]) => String(m).includes("bench_sheets.sheet"))).toBe(true);
    warn.mockRestore();
  });

  it("fills the lists an older verdict lacks, and reads a verdict it cannot read as null", async () => {
    const { row } = await storedSheet();
    await sequelize.query(`UPDATE bench_sheets SET verdict = verdict - 'skipped' - 'fromCaptures' WHERE id = :id`, {
      replacements: { id: row.id },
    });
    const older = await reread(row.id);
    expect(older.verdict?.skipped).toEqual([]);
    expect(older.verdict?.fromCaptures).toEqual([]);

    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    await sequelize.query(`UPDATE bench_sheets SET verdict = '{"summary": 3}' WHERE id = :id`, { replacements: { id: row.id } });
    expect((await reread(row.id)).verdict).toBeNull();
    warn.mockRestore();
  });
});

describe("a capture row", () => {
  it("reads its conditions typed, and conditions it cannot read as null", async () => {
    const { seller } = await storedSheet();
    const capture = await Capture.create({
      ownerId: seller.user.id,
      kind: "square",
      fileName: "square.csv",
      contentType: "text/csv",
      byteSize: 10,
      storageKey: `it/json/${keySuffix()}.csv`,
      format: { file: "csv", rows: 2, header: null },
      conditions: { kind: "square", loadOhm: 8 },
    });
    const again = (await Capture.findByPk(capture.id))!;
    expect(again.conditions).toEqual({ kind: "square", loadOhm: 8 });
    expect(again.format).toEqual({ file: "csv", rows: 2, header: null });

    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    await sequelize.query(`UPDATE captures SET conditions = '{"kind": "sine"}' WHERE id = :id`, { replacements: { id: capture.id } });
    expect((await Capture.findByPk(capture.id))!.conditions).toBeNull();
    warn.mockRestore();
  });
});
