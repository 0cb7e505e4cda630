import { crc32 } from "node:zlib";
import { describe, expect, it } from "vitest";
import { renderPhoto } from "~/photos/render.server";
import { stripJpegMetadata } from "~/photos/strip.server";
import { decodeSequentialJpeg } from "~/photos/jpeg-decode.server";
import { decodePng } from "~/photos/png-decode.server";
import { encodeJpeg } from "~/photos/jpeg-encode.server";
import { encodePng } from "~/photos/png-encode.server";
import { exifOrientation, pngOrientation } from "~/photos/exif-orientation.server";
import { GPS_MARK, exifSegment, jpegHeaderMarkers, pngChunkTypes, sceneJpeg, withExif, withPngText } from "../../support/photo-files";

// The stored original (docs/decisions/0034): an upright upload keeps its own image data byte for
// byte with every metadata segment left out; a turned one is written again upright; PNG eXIf
// orientation is applied like JPEG's EXIF.

const latitudeBytes = () => {
  const b = Buffer.alloc(24);
  GPS_MARK.latitude.forEach((v, i) => {
    b.writeUInt32BE(v, i * 8);
    b.writeUInt32BE(1, i * 8 + 4);
  });
  return b;
};

/** Each marker segment of a JPEG header as [marker, bytes], and the bytes from the first SOS to EOI. */
function jpegParts(jpeg: Buffer) {
  const segments: [number, Buffer][] = [];
  let pos = 2;
  while (jpeg[pos + 1] !== 0xda) {
    const end = pos + 2 + jpeg.readUInt16BE(pos + 2);
    segments.push([jpeg[pos + 1], jpeg.subarray(pos, end)]);
    pos = end;
  }
  const eoi = jpeg.lastIndexOf(Buffer.from([0xff, 0xd9]));
  return { segments, image: jpeg.subarray(pos, eoi + 2) };
}

function pngChunk(type: string, data: Buffer): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, "latin1");
  data.copy(out, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)), 8 + data.length);
  return out;
}

// Where the stored image's top-left and top-right corners show once upright (CIPA DC-008, 0x0112).
const UPRIGHT: Record<number, [string, string]> = {
  2: ["TR", "TL"],
  3: ["BR", "BL"],
  4: ["BL", "BR"],
  5: ["TL", "BL"],
  6: ["BL", "TL"],
  7: ["BR", "TR"],
  8: ["TR", "BR"],
};
const CORNER_COLOURS: Record<string, number[]> = { TL: [220, 30, 30], TR: [30, 200, 30], BL: [30, 30, 220], BR: [240, 240, 240] };

/** Odd sizes, so partial blocks and half chroma samples sit at the edges that turning moves. */
function quadrants(w = 45, h = 27) {
  const data = Buffer.alloc(w * h * 4);
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) data.set([...CORNER_COLOURS[`${y < h / 2 ? "T" : "B"}${x < w / 2 ? "L" : "R"}`], 255], (y * w + x) * 4);
  return { data, width: w, height: h };
}

function expectCorners(out: { data: Buffer; width: number }, [topLeft, topRight]: [string, string], tolerance: number) {
  const at = (x: number, y: number) => [...out.data.subarray((y * out.width + x) * 4, (y * out.width + x) * 4 + 3)];
  const near = (got: number[], want: number[]) => got.every((v, i) => Math.abs(v - want[i]) <= tolerance);
  expect(near(at(2, 2), CORNER_COLOURS[topLeft]), `top left ${at(2, 2).join(",")}`).toBe(true);
  expect(near(at(out.width - 3, 2), CORNER_COLOURS[topRight]), `top right ${at(out.width - 3, 2).join(",")}`).toBe(true);
}

describe("the stored original", { timeout: 60_000 }, () => {
  it("of an upright JPEG is its own tables and image data byte for byte, with no EXIF, GPS, comment or trailer", async () => {
    const plain = await sceneJpeg(3, 320, 240, 90);
    const text = Buffer.from("Workshop 3, Elmbridge Lane", "latin1");
    const comment = Buffer.concat([Buffer.from([0xff, 0xfe, 0, 2 + text.length]), text]);
    const upload = Buffer.concat([withExif(plain, { orientation: 1, gps: true }).subarray(0, -2), Buffer.from([0xff, 0xd9]), comment]);
    const withComment = Buffer.concat([upload.subarray(0, 2), comment, upload.subarray(2)]);
    expect(withComment.includes(latitudeBytes())).toBe(true);

    const out = await renderPhoto(withComment, "image/jpeg");
    const body = out.original.body;
    expect(jpegHeaderMarkers(body).filter((m) => /^E[0-9A-F]$|^FE$/.test(m))).toEqual([]);
    expect(body.includes(latitudeBytes())).toBe(false);
    expect(body.includes(Buffer.from("Exif\0"))).toBe(false);
    expect(body.includes(Buffer.from("Elmbrid"))).toBe(false);
    // Tables, frame and scans unchanged; nothing after EOI.
    const before = jpegParts(plain);
    const after = jpegParts(body);
    const kept = (parts: [number, Buffer][]) => parts.filter(([m]) => m < 0xe0 || m > 0xef).map(([, b]) => b.toString("hex"));
    expect(kept(after.segments)).toEqual(kept(before.segments));
    expect(after.image.equals(before.image)).toBe(true);
    expect(body.subarray(-2).toString("hex")).toBe("ffd9");
    expect(decodeSequentialJpeg(body).data.equals(decodeSequentialJpeg(plain).data)).toBe(true);
  });

  it("keeps Adobe's colour-transform flag and nothing else of APP14", () => {
    const plain = encodeJpeg(quadrants(), { quality: 90 });
    // APP14 "Adobe": version 100, flags0 0x8000, flags1 0x0001, transform 1 (YCbCr).
    const adobe = Buffer.from([0xff, 0xee, 0, 14, 0x41, 0x64, 0x6f, 0x62, 0x65, 0, 100, 0x80, 0, 0, 1, 1]);
    const stripped = stripJpegMetadata(Buffer.concat([plain.subarray(0, 2), adobe, plain.subarray(2)]));
    const app14 = jpegParts(stripped).segments.filter(([m]) => m === 0xee);
    expect(app14.map(([, b]) => b.toString("hex"))).toEqual(["ffee000e41646f626500640000000001"]);
  });

  it.each(Object.entries(UPRIGHT))("of a JPEG with orientation %s is written again upright, without EXIF", async (orientation, corners) => {
    // Even sizes are turned plane by plane; odd ones at 4:2:0 go through RGBA.
    for (const [source, subsampling] of [
      [quadrants(48, 28), "4:2:0"],
      [quadrants(48, 28), "4:2:2"],
      [quadrants(), "4:4:4"],
      [quadrants(), "4:2:0"],
    ] as const) {
      const upload = withExif(encodeJpeg(source, { quality: 95, subsampling }), { orientation: Number(orientation), gps: true });
      const out = await renderPhoto(upload, "image/jpeg");
      const swapped = Number(orientation) >= 5;
      const [w, h] = [source.width, source.height];
      expect([out.original.width, out.original.height]).toEqual(swapped ? [h, w] : [w, h]);
      expect(jpegHeaderMarkers(out.original.body).filter((m) => /^E[1-9A-F]$|^FE$/.test(m))).toEqual([]);
      expect(out.original.body.includes(latitudeBytes())).toBe(false);
      expect(exifOrientation(out.original.body)).toBe(1);
      const decoded = decodeSequentialJpeg(out.original.body);
      expect([decoded.width, decoded.height]).toEqual([out.original.width, out.original.height]);
      expectCorners(decoded, corners, 16);
      // The turned original matches the upload decoded upright, one more JPEG generation at quality 92
      // apart: within 24 levels (ringing of the 8 × 8 blocks) everywhere but the 3 pixels either side
      // of the sharp quadrant edges, where chroma samples are averaged anew.
      const reference = decodeSequentialJpeg(upload, Number(orientation));
      let worst = 0;
      for (let y = 0; y < decoded.height; y++) {
        for (let x = 0; x < decoded.width; x++) {
          if (Math.abs(x + 0.5 - decoded.width / 2) < 3 || Math.abs(y + 0.5 - decoded.height / 2) < 3) continue;
          for (let c = 0; c < 3; c++) {
            const i = (y * decoded.width + x) * 4 + c;
            worst = Math.max(worst, Math.abs(decoded.data[i] - reference.data[i]));
          }
        }
      }
      expect(worst, `${w} × ${h} ${subsampling}`).toBeLessThanOrEqual(24);
    }
  });
});

describe("a PNG's eXIf orientation", { timeout: 60_000 }, () => {
  /** The PNG with an eXIf chunk (TIFF structure, no "Exif\0\0" prefix) after IHDR, and a text chunk. */
  async function pngWithExif(orientation: number) {
    const png = await encodePng(quadrants());
    const tiff = exifSegment({ orientation, gps: true }).subarray(10);
    const withChunk = Buffer.concat([png.subarray(0, 33), pngChunk("eXIf", tiff), png.subarray(33)]);
    return withPngText(withChunk, "Comment", "Bench 2, Elmbridge Lane");
  }

  it("is read from the chunk", async () => {
    expect(pngOrientation(await pngWithExif(6))).toBe(6);
    expect(pngOrientation(await encodePng(quadrants()))).toBe(1);
  });

  it.each(Object.entries(UPRIGHT))("%s turns the sizes and the lossless original upright", async (orientation, corners) => {
    const upload = await pngWithExif(Number(orientation));
    expect(pngChunkTypes(upload)).toContain("eXIf");
    const out = await renderPhoto(upload, "image/png");
    const swapped = Number(orientation) >= 5;
    expect([out.original.width, out.original.height]).toEqual(swapped ? [27, 45] : [45, 27]);
    expect(pngChunkTypes(out.original.body)).toEqual(["IHDR", "IDAT", "IEND"]);
    expect(out.original.body.includes(latitudeBytes())).toBe(false);
    const original = await decodePng(out.original.body);
    expectCorners(original, corners, 0); // lossless: exactly the colours
    expectCorners(decodeSequentialJpeg(out.sizes.thumb.body), corners, 16);
  });

  it("of 1 leaves the PNG's own IHDR and IDAT byte for byte, its other chunks dropped", async () => {
    const upload = await pngWithExif(1);
    const out = await renderPhoto(upload, "image/png");
    expect(pngChunkTypes(out.original.body)).toEqual(["IHDR", "IDAT", "IEND"]);
    const idat = (png: Buffer) => png.subarray(png.indexOf(Buffer.from("IDAT")) - 4, png.indexOf(Buffer.from("IEND")) - 4);
    expect(idat(out.original.body).equals(idat(upload))).toBe(true);
    expect(out.original.body.subarray(0, 33).equals(upload.subarray(0, 33))).toBe(true);
    expect(out.original.body.includes(Buffer.from("Elmbridge"))).toBe(false);
  });
});
