import { deflateSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import { Jimp } from "jimp";
import { decodePng, inflatedPngSize, PngDataProblem } from "~/photos/png-decode.server";
import { encodePng } from "~/photos/png-encode.server";
import { decodeSequentialJpeg, ProgressiveJpeg } from "~/photos/jpeg-decode.server";
import { encodeJpeg, type JpegOptions } from "~/photos/jpeg-encode.server";
import { exifOrientation } from "~/photos/exif-orientation.server";
import type { Bitmap } from "~/photos/pixels.server";
import { jpegHeaderMarkers, pngWithData, sceneJpeg, twoToneJpeg, withExif } from "../../support/photo-files";
import { writePng, type PngSpec } from "../../support/png-writer";

// Our PNG and JPEG codecs against jimp's (pngjs and jpeg-js) as the reference, on files written
// with every colour type, depth, filter, interlacing, chroma sampling and restart interval.

async function reference(file: Buffer): Promise<Bitmap> {
  return (await Jimp.fromBuffer(file)).bitmap;
}

function largestDifference(a: Bitmap, b: Bitmap): number {
  expect([a.width, a.height]).toEqual([b.width, b.height]);
  let max = 0;
  for (let i = 0; i < a.data.length; i++) max = Math.max(max, Math.abs(a.data[i] - b.data[i]));
  return max;
}

/** A picture with smooth gradients and hard edges, the same at any size. */
function picture(width: number, height: number, alpha = false): Bitmap {
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      const block = ((x >> 3) + (y >> 3)) % 3 === 0;
      data[i] = block ? 200 : Math.round((x / width) * 180) + 20;
      data[i + 1] = Math.round((y / height) * 200) + 10;
      data[i + 2] = block ? 40 : Math.round(((x + y) / (width + height)) * 220);
      data[i + 3] = alpha ? (x * 255) / Math.max(1, width - 1) : 255;
    }
  }
  return { data, width, height };
}

describe("PNG decoding", () => {
  const kinds: [PngSpec["colour"], PngSpec["depth"][]][] = [
    [0, [1, 2, 4, 8, 16]],
    [2, [8, 16]],
    [3, [1, 2, 4, 8]],
    [4, [8, 16]],
    [6, [8, 16]],
  ];
  const cases = kinds.flatMap(([colour, depths]) =>
    depths.flatMap((depth) =>
      [false, true].map(
        (interlaced) => [`colour type ${colour}, ${depth}-bit${interlaced ? ", interlaced" : ""}`, { colour, depth, interlaced }] as const,
      ),
    ),
  );

  it.each(cases)("%s, every filter, matches the reference decoder", async (_name, { colour, depth, interlaced }) => {
    const max = 2 ** depth - 1;
    const palette =
      colour === 3 ? Array.from({ length: Math.min(256, max + 1) }, (_, i) => [(i * 7) % 256, 255 - i, (i * 3) % 256]) : undefined;
    const transparency = palette ? Buffer.from([0, 64, 128].slice(0, palette.length)) : undefined;
    for (const [width, height] of [
      [13, 9],
      [1, 1],
      [3, 2],
      [9, 17],
    ]) {
      const png = writePng({ width, height, depth, colour, interlaced, filters: [0, 1, 2, 3, 4], palette, transparency }, (x, y, c) =>
        Math.round((((x * 3 + y * 5 + c * 7) % (width + height + 3)) / (width + height + 2)) * max),
      );
      const ours = await decodePng(png);
      expect(largestDifference(ours, await reference(png)), `${width} × ${height}`).toBeLessThanOrEqual(1);
    }
  });

  it("keys out the tRNS colour of grey and RGB images", async () => {
    const key = Buffer.from([0, 10, 0, 20, 0, 30]);
    const png = writePng({ width: 4, height: 1, depth: 8, colour: 2, transparency: key }, (x, _y, c) => (x === 2 ? [10, 20, 30][c] : 99));
    const ours = await decodePng(png);
    expect([...ours.data.subarray(8, 12)]).toEqual([10, 20, 30, 0]);
    expect(ours.data[3]).toBe(255);
  });

  it("knows how many bytes every layout inflates to, interlaced passes included", () => {
    // 8 × 8 RGBA interlaced: passes of 1×1, 1×1, 2×1, 2×2, 4×2, 4×4, 8×4 pixels, one filter byte per row.
    expect(inflatedPngSize({ width: 8, height: 8, depth: 8, colour: 6, interlaced: true })).toBe(
      [
        [1, 1],
        [1, 1],
        [2, 1],
        [2, 2],
        [4, 2],
        [4, 4],
        [8, 4],
      ].reduce((n, [w, h]) => n + h * (1 + w * 4), 0),
    );
    expect(inflatedPngSize({ width: 7000, height: 7000, depth: 16, colour: 2, interlaced: false })).toBe(7000 * (1 + 7000 * 6));
    expect(inflatedPngSize({ width: 1, height: 1, depth: 1, colour: 0, interlaced: true })).toBe(2);
  });

  it("refuses data that ends early or names an unknown filter", async () => {
    const header = { width: 4, height: 4, depth: 8 as const, colour: 0 as const };
    const short = pngWithData(header, deflateSync(Buffer.alloc(3 * 5)));
    await expect(decodePng(short)).rejects.toThrow(new PngDataProblem("its image data ends before the last row"));
    const badFilter = pngWithData(header, deflateSync(Buffer.from([7, 0, 0, 0, 0, ...Array(15).fill(0)])));
    await expect(decodePng(badFilter)).rejects.toThrow(/unknown filter \(7\)/);
  });
});

describe("PNG encoding", () => {
  it("writes RGB when every pixel is opaque and RGBA otherwise, losslessly", async () => {
    for (const alpha of [false, true]) {
      const source = picture(37, 21, alpha);
      const png = await encodePng(source);
      expect(png[25]).toBe(alpha ? 6 : 2); // IHDR colour type
      expect(largestDifference(await reference(png), source)).toBe(0);
      expect(largestDifference(await decodePng(png), source)).toBe(0);
    }
  });
});

describe("JPEG decoding", () => {
  const variants: [string, JpegOptions][] = [
    ["4:4:4", { quality: 90, subsampling: "4:4:4" }],
    ["4:2:2", { quality: 90, subsampling: "4:2:2" }],
    ["4:2:0", { quality: 90, subsampling: "4:2:0" }],
    ["4:2:0 with restart markers every 5 MCUs", { quality: 75, subsampling: "4:2:0", restartInterval: 5 }],
    ["4:4:4 with restart markers every MCU", { quality: 95, subsampling: "4:4:4", restartInterval: 1 }],
    ["greyscale", { quality: 85, grey: true }],
  ];

  it.each(variants)("%s, at odd sizes, matches the reference decoder", async (_name, options) => {
    for (const [width, height] of [
      [37, 23],
      [8, 8],
      [1, 1],
      [17, 33],
    ]) {
      const jpeg = encodeJpeg(picture(width, height), options);
      expect(largestDifference(decodeSequentialJpeg(jpeg), await reference(jpeg)), `${width} × ${height}`).toBeLessThanOrEqual(4);
    }
  });

  it("reads another encoder's files", async () => {
    const jpeg = await sceneJpeg(11, 333, 222, 80);
    expect(largestDifference(decodeSequentialJpeg(jpeg), await reference(jpeg))).toBeLessThanOrEqual(4);
  });

  it("hands a progressive file back to the general decoder", () => {
    const jpeg = encodeJpeg(picture(16, 16), { quality: 80 });
    jpeg[jpeg.indexOf(Buffer.from([0xff, 0xc0])) + 1] = 0xc2;
    expect(() => decodeSequentialJpeg(jpeg)).toThrow(ProgressiveJpeg);
  });

  // Where the stored image's top-left and top-right corners show once upright (CIPA DC-008, 0x0112).
  const UPRIGHT: Record<number, [string, string]> = {
    1: ["TL", "TR"],
    2: ["TR", "TL"],
    3: ["BR", "BL"],
    4: ["BL", "BR"],
    5: ["TL", "BL"],
    6: ["BL", "TL"],
    7: ["BR", "TR"],
    8: ["TR", "BR"],
  };
  const CORNER_COLOURS: Record<string, number[]> = { TL: [220, 30, 30], TR: [30, 200, 30], BL: [30, 30, 220], BR: [240, 240, 240] };

  it.each(Object.entries(UPRIGHT))("orientation %s turns the picture upright while decoding", async (orientation, [topLeft, topRight]) => {
    const w = 32;
    const h = 16;
    const data = Buffer.alloc(w * h * 4);
    for (let y = 0; y < h; y++)
      for (let x = 0; x < w; x++) data.set([...CORNER_COLOURS[`${y < h / 2 ? "T" : "B"}${x < w / 2 ? "L" : "R"}`], 255], (y * w + x) * 4);
    const jpeg = withExif(encodeJpeg({ data, width: w, height: h }, { quality: 95, subsampling: "4:4:4" }), {
      orientation: Number(orientation),
      gps: false,
    });
    expect(exifOrientation(jpeg)).toBe(Number(orientation));
    const out = decodeSequentialJpeg(jpeg, exifOrientation(jpeg));
    const swapped = Number(orientation) >= 5;
    expect([out.width, out.height]).toEqual(swapped ? [h, w] : [w, h]);
    const at = (x: number, y: number) => [...out.data.subarray((y * out.width + x) * 4, (y * out.width + x) * 4 + 3)];
    const near = (got: number[], want: number[]) => got.every((v, i) => Math.abs(v - want[i]) <= 12);
    expect(near(at(1, 1), CORNER_COLOURS[topLeft]), `top left ${at(1, 1).join(",")}`).toBe(true);
    expect(near(at(out.width - 2, 1), CORNER_COLOURS[topRight]), `top right ${at(out.width - 2, 1).join(",")}`).toBe(true);
  });
});

describe("JPEG encoding", () => {
  it("writes a baseline JFIF file with nothing but the picture, close to the source", async () => {
    const source = picture(64, 48);
    const jpeg = encodeJpeg(source, { quality: 92 });
    expect(jpegHeaderMarkers(jpeg)).toEqual(["E0", "DB", "DB", "C0", "C4", "C4", "C4", "C4", "DA"]);
    const decoded = await reference(jpeg);
    let sum = 0;
    for (let i = 0; i < source.data.length; i++) if (i % 4 !== 3) sum += (decoded.data[i] - source.data[i]) ** 2;
    const psnr = 10 * Math.log10((255 * 255) / (sum / (64 * 48 * 3)));
    expect(psnr).toBeGreaterThan(30);
  });

  it("ignores the EXIF block of what it re-encodes: only pixels go in", async () => {
    const upload = withExif(await twoToneJpeg(40, 30), { orientation: 3 });
    const again = encodeJpeg(decodeSequentialJpeg(upload, 1), { quality: 80 });
    expect(again.includes(Buffer.from("Exif\0"))).toBe(false);
    expect(exifOrientation(again)).toBe(1);
  });
});
