import { describe, expect, it } from "vitest";
import { Jimp } from "jimp";
import { encodeJpeg, encodeJpegSlice, mcuRows } from "~/photos/jpeg-encode.server";
import type { Bitmap } from "~/photos/pixels.server";

// The encoder's block path — transform, quantisation, Huffman coding and bit packing — read back by
// another decoder (jimp's jpeg-js) and compared with a plain reference written here: the DCT by its
// defining sums (ITU-T T.81, A.3.3), each coefficient divided by its quantiser and rounded, then the
// inverse by its sums. At quality 100 every quantiser is 1 (the Annex K tables scaled by 0), so the
// file should give back the reference's pixels within the two decoders' integer rounding.

let seed = 2027;
const random = () => (seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32;

const C = (k: number) => (k === 0 ? Math.SQRT1_2 : 1);
const basis = (x: number, u: number) => Math.cos(((2 * x + 1) * u * Math.PI) / 16);

/** One 8 × 8 block of samples (0–255) through a quantiser of 1: forward sums, rounding, inverse sums. */
function referenceBlock(samples: number[]): number[] {
  const coefficients: number[] = [];
  for (let v = 0; v < 8; v++)
    for (let u = 0; u < 8; u++) {
      let s = 0;
      for (let y = 0; y < 8; y++) for (let x = 0; x < 8; x++) s += (samples[y * 8 + x] - 128) * basis(x, u) * basis(y, v);
      coefficients.push(Math.round((C(u) * C(v) * s) / 4));
    }
  const out: number[] = [];
  for (let y = 0; y < 8; y++)
    for (let x = 0; x < 8; x++) {
      let s = 0;
      for (let v = 0; v < 8; v++) for (let u = 0; u < 8; u++) s += C(u) * C(v) * coefficients[v * 8 + u] * basis(x, u) * basis(y, v);
      out.push(Math.min(255, Math.max(0, Math.round(s / 4 + 128))));
    }
  return out;
}

/** A grey picture as RGBA (R = G = B, so Y is the grey level exactly). */
function greyBitmap(width: number, height: number, level: (x: number, y: number) => number): Bitmap {
  const data = Buffer.alloc(width * height * 4, 255);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) data.fill(level(x, y), (y * width + x) * 4, (y * width + x) * 4 + 3);
  return { data, width, height };
}

async function decodedGrey(jpeg: Buffer): Promise<{ width: number; at: (x: number, y: number) => number }> {
  const { data, width } = (await Jimp.fromBuffer(jpeg)).bitmap;
  return { width, at: (x, y) => data[(y * width + x) * 4] };
}

function psnr(a: Bitmap, b: Bitmap): number {
  let sum = 0;
  for (let i = 0; i < a.data.length; i++) if (i % 4 !== 3) sum += (a.data[i] - b.data[i]) ** 2;
  return 10 * Math.log10((255 * 255) / (sum / ((a.data.length / 4) * 3)));
}

describe("JPEG encoding, block by block", () => {
  it("gives back the reference transform's pixels for random blocks at quality 100", async () => {
    // 12 blocks side by side: each DC is coded as the difference from the one before (F.1.2.1).
    const blocks = 12;
    const samples = Array.from({ length: blocks }, () => Array.from({ length: 64 }, () => Math.floor(random() * 256)));
    const bitmap = greyBitmap(8 * blocks, 8, (x, y) => samples[x >> 3][y * 8 + (x & 7)]);
    const jpeg = encodeJpeg(bitmap, { quality: 100, grey: true });
    // Noise this strong makes coefficients of hundreds and entropy-coded 0xFF bytes, stuffed by 0x00.
    const scan = jpeg.subarray(jpeg.indexOf(Buffer.from([0xff, 0xda])) + 10, jpeg.length - 2);
    expect(scan.indexOf(Buffer.from([0xff, 0x00]))).toBeGreaterThanOrEqual(0);
    const decoded = await decodedGrey(jpeg);
    for (let b = 0; b < blocks; b++) {
      const want = referenceBlock(samples[b]);
      for (let i = 0; i < 64; i++) {
        const got = decoded.at(b * 8 + (i & 7), i >> 3);
        expect(Math.abs(got - want[i]), `block ${b}, sample ${i}: ${got} against ${want[i]}`).toBeLessThanOrEqual(2);
      }
    }
  });

  it("codes a block whose only AC coefficient is the last in zig-zag order (runs of zeros past 16)", async () => {
    // 128 + 49.5 · cos(7π(2x+1)/16) · cos(7π(2y+1)/16) has F(7,7) = 4 · 49.5 = 198 (A.3.3) and DC only
    // besides, up to the samples' rounding; blocks of different levels exercise the DC prediction.
    const levels = [128, 60, 200, 128];
    const bitmap = greyBitmap(32, 8, (x, y) => Math.round(levels[x >> 3] + 49.5 * basis(x & 7, 7) * basis(y, 7)));
    const decoded = await decodedGrey(encodeJpeg(bitmap, { quality: 100, grey: true }));
    for (let y = 0; y < 8; y++)
      for (let x = 0; x < 32; x++) expect(Math.abs(decoded.at(x, y) - bitmap.data[(y * 32 + x) * 4]), `${x}, ${y}`).toBeLessThanOrEqual(2);
  });

  it.each([
    ["thumbnail", 80],
    ["listing", 84],
    ["zoom", 86],
    ["original", 92],
  ])("round trip at the %s quality (%i): PSNR of a photo-like picture at least 33 dB", async (_size, quality) => {
    // Gradients, hard edges and sensor-like noise of ±8 levels, at a size of no whole MCUs.
    const width = 203;
    const height = 157;
    const data = Buffer.alloc(width * height * 4, 255);
    for (let y = 0; y < height; y++)
      for (let x = 0; x < width; x++) {
        const edge = ((x >> 5) + (y >> 5)) % 3 === 0 ? 50 : 0;
        const n = Math.floor(random() * 17) - 8; // in brightness, as a sensor's noise mostly is
        data.set([40 + x / 2 + edge + n, 30 + y + n, 200 - (x + y) / 3 + n], (y * width + x) * 4);
      }
    const source = { data, width, height };
    const decoded = (await Jimp.fromBuffer(encodeJpeg(source, { quality }))).bitmap;
    // 30 dB is the usual floor for an acceptable lossy picture (common practice); at these qualities
    // the picture clears it by a margin (35.4–38.5 dB when written), so a broken coder cannot pass.
    expect(psnr(source, decoded)).toBeGreaterThanOrEqual(33);
  });

  it("slices of MCU rows, put end to end, are a file that decodes to the same pixels as the whole", async () => {
    // 203 × 157 is 10 MCU rows, the last partial: each row is a restart interval, so only the DC
    // prediction differs from a file without restarts, and the coefficients, hence pixels, are equal.
    const width = 203;
    const height = 157;
    const data = Buffer.alloc(width * height * 4, 255);
    for (let i = 0; i < width * height; i++) data.set([random() * 256, (i % width) + random() * 40, (i / width) % 256], i * 4);
    const source = { data, width, height };
    const whole = (await Jimp.fromBuffer(encodeJpeg(source, { quality: 86 }))).bitmap;
    expect(mcuRows(height)).toBe(10);
    for (const split of [0, 3, 8, 10]) {
      const file = Buffer.concat([encodeJpegSlice(source, 86, 0, split), encodeJpegSlice(source, 86, split, 10)]);
      expect(file.indexOf(Buffer.from([0xff, 0xdd]))).toBeGreaterThan(0); // DRI
      expect(file.subarray(-2)).toEqual(Buffer.from([0xff, 0xd9]));
      const decoded = (await Jimp.fromBuffer(file)).bitmap;
      expect([decoded.width, decoded.height]).toEqual([width, height]);
      expect(Buffer.compare(decoded.data, whole.data), `split at row ${split}`).toBe(0);
    }
  });
});
