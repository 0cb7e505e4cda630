import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { inspectPhoto } from "~/photos/inspect.server";
import { PhotoRefusal } from "~/photos/refusal.server";
import { renderPhoto, UnreadableImage } from "~/photos/render.server";
import { budgetProblem, PHOTO_MEMORY_BUDGET, processingCost } from "~/photos/budget.server";
import { PHOTO_LIMITS } from "~/photos/limits";
import { blackRgb16Png, interlacedPngBomb, jpegClaiming, sceneJpeg } from "../../support/photo-files";

// Image bombs: small files that would make the photo worker allocate gigabytes. Each is refused
// before its pixels are decoded, or decoded within the memory budget. The memory bounds are
// measured in a process of its own (tests/support/photo-memory.ts): peak resident memory is
// behaviour, not timing.

const root = path.resolve(import.meta.dirname, "../../..");
const dir = mkdtempSync(path.join(tmpdir(), "loadline-bombs-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

type Measured = { outcome: "ready" | "refused" | "error"; message?: string; baselineMb: number; peakMb: number };

function renderApart(name: string, bytes: Buffer, type: "image/jpeg" | "image/png"): Measured {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  const out = execFileSync(path.join(root, "node_modules/.bin/tsx"), ["tests/support/photo-memory.ts", file, type], {
    cwd: root,
    encoding: "utf8",
    maxBuffer: 1 << 20,
  });
  return JSON.parse(out.trim().split("\n").at(-1)!) as Measured;
}

async function refusal(promise: Promise<unknown>): Promise<Error> {
  try {
    await promise;
  } catch (error) {
    return error as Error;
  }
  throw new Error("it was accepted");
}

describe("image bombs", { timeout: 120_000 }, () => {
  it("an interlaced 64 × 64 PNG whose data inflates to 1 GiB is refused, unpacking little more than its 21 KB", async () => {
    const bomb = interlacedPngBomb();
    expect(bomb.length).toBeLessThan(PHOTO_LIMITS.maxBytes); // an upload the web process accepts
    const error = await refusal(renderPhoto(bomb, "image/png"));
    expect(error).toBeInstanceOf(UnreadableImage);
    expect(error.message).toBe(
      "The photo could not be decoded: its image data unpacks to more than the 64 × 64 pixels its header gives. " +
        "Export the photo again and upload the new file.",
    );
    const measured = renderApart("bomb.png", bomb, "image/png");
    expect(measured.outcome).toBe("refused");
    expect(measured.peakMb - measured.baselineMb).toBeLessThan(100);
  });

  it("a JPEG of a few hundred bytes claiming 7000 × 7000 pixels is refused from its header, at upload and in the worker", async () => {
    const jpeg = await jpegClaiming(7000, 7000);
    expect(jpeg.length).toBeLessThan(1000);
    const atUpload = await refusal(inspectPhoto(jpeg, "front.jpg"));
    expect(atUpload).toBeInstanceOf(PhotoRefusal);
    expect((atUpload as PhotoRefusal).code).toBe("damaged_file");
    expect(atUpload.message).toMatch(
      /^“front\.jpg” is a JPEG photo, but it is damaged: its header says 7000 × 7000 pixels, yet it carries only \d+ bytes of image data, too little for that many pixels\./,
    );
    const measured = renderApart("claim.jpg", jpeg, "image/jpeg");
    expect(measured.outcome).toBe("refused");
    expect(measured.peakMb - measured.baselineMb).toBeLessThan(50);
  });

  it("a 49-megapixel 16-bit PNG is processed within the budget, the worker well under 1 GB", async () => {
    const png = blackRgb16Png(7000, 7000);
    await expect(inspectPhoto(png, "scan.png")).resolves.toMatchObject({ width: 7000, height: 7000 });
    const measured = renderApart("deep.png", png, "image/png");
    expect(measured.outcome).toBe("ready");
    expect((measured.peakMb - measured.baselineMb) * 2 ** 20).toBeLessThan(PHOTO_MEMORY_BUDGET);
    expect(measured.peakMb).toBeLessThan(1024);
  });

  it("a progressive JPEG too large for the budget is refused at upload with advice", async () => {
    // A real baseline file with its frame marker turned progressive and its size enlarged: the
    // check reads only the header and the amount of image data.
    const jpeg = Buffer.from(await sceneJpeg(4, 1600, 1200, 95));
    const sof = jpeg.indexOf(Buffer.from([0xff, 0xc0]));
    jpeg[sof + 1] = 0xc2;
    jpeg.writeUInt16BE(6000, sof + 5);
    jpeg.writeUInt16BE(8000, sof + 7);
    const error = (await refusal(inspectPhoto(jpeg, "scan.jpg"))) as PhotoRefusal;
    expect(error.code).toBe("too_large_to_process");
    expect(error.status).toBe(422);
    expect(error.message).toMatch(
      /^“scan\.jpg” is a progressive JPEG of 8000 × 6000 pixels that would need \d+ MB of memory to process; photos may use at most 640 MB\. Save it as a standard \(baseline\) JPEG, or scale it down to about \d+ megapixels/,
    );
  });
});

describe("the memory budget", () => {
  const dims = fc
    .record({ width: fc.integer({ min: 1, max: 65_535 }), height: fc.integer({ min: 1, max: 65_535 }) })
    .filter(({ width, height }) => width * height <= PHOTO_LIMITS.maxMegapixels * 1_000_000);

  it("never refuses a PNG or a sequential JPEG within the upload limits (20 MB, 50 megapixels)", () => {
    const factor = fc.integer({ min: 1, max: 4 });
    fc.assert(
      fc.property(
        dims,
        fc.integer({ min: 1, max: PHOTO_LIMITS.maxBytes }),
        fc.array(fc.record({ h: factor, v: factor }), { minLength: 1, maxLength: 4 }),
        (d, byteSize, sampling) => {
          const png = { type: "image/png" as const, byteSize, png: { ...d, depth: 16, colour: 6, interlaced: true } };
          expect(budgetProblem(png, "x")).toBeNull();
          const jpeg = { type: "image/jpeg" as const, byteSize, jpeg: { ...d, sampling, progressive: false, scanBytes: byteSize } };
          const mcus = Math.ceil(d.width / 8) * Math.ceil(d.height / 8);
          if (byteSize * 8 >= mcus) expect(budgetProblem(jpeg, "x")).toBeNull();
        },
      ),
    );
  });

  it("counts 16-bit and interlaced PNGs by their RGBA result, and jpeg-js's blocks for progressive JPEGs", () => {
    const png = processingCost({
      type: "image/png",
      byteSize: 2e6,
      png: { width: 7000, height: 7000, depth: 16, colour: 2, interlaced: false },
    });
    expect(png).toBeGreaterThan(7000 * 7000 * 4);
    expect(png).toBeLessThan(PHOTO_MEMORY_BUDGET);
    const sampling = [
      { h: 2, v: 2 },
      { h: 1, v: 1 },
      { h: 1, v: 1 },
    ];
    const jpeg = (progressive: boolean) =>
      processingCost({ type: "image/jpeg", byteSize: 12e6, jpeg: { width: 8160, height: 6120, sampling, progressive, scanBytes: 12e6 } });
    expect(jpeg(false)).toBeLessThan(PHOTO_MEMORY_BUDGET);
    expect(jpeg(true)).toBeGreaterThan(PHOTO_MEMORY_BUDGET);
  });
});
