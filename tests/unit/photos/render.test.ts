import { beforeAll, describe, expect, it } from "vitest";
import { renderPhoto, phashDistance, type RenderedPhoto } from "~/photos/render.server";
import {
  GPS_MARK,
  bandColour,
  jpegHeaderMarkers,
  plainPng,
  pngChunkTypes,
  sceneJpeg,
  twoToneJpeg,
  withExif,
  withPngText,
} from "../../support/photo-files";

// Pure-JS decoding is slow on a small machine; each test keeps its images small.
describe("renderPhoto", { timeout: 60_000 }, () => {
  let upload: Buffer;
  let out: RenderedPhoto;
  beforeAll(async () => {
    // Stored 1400 × 700, left half red; EXIF orientation 6 (CIPA DC-008, tag 0x0112: "the 0th row is
    // the visual right-hand side, the 0th column the visual top"), so it shows 700 × 1400, red on top.
    upload = withExif(await twoToneJpeg(1400, 700), { orientation: 6, gps: true });
    out = await renderPhoto(upload, "image/jpeg");
  }, 60_000);

  it("turns an orientation-6 JPEG upright", async () => {
    expect(jpegHeaderMarkers(upload)).toContain("E1"); // the upload really carries EXIF
    expect(out.original).toMatchObject({ contentType: "image/jpeg", width: 700, height: 1400 });
    const top = await bandColour(out.sizes.thumb.body, 0.1);
    const bottom = await bandColour(out.sizes.thumb.body, 0.9);
    expect(top.red).toBeGreaterThan(150);
    expect(top.blue).toBeLessThan(100);
    expect(bottom.blue).toBeGreaterThan(150);
    expect(bottom.red).toBeLessThan(100);
  });

  it("leaves no EXIF block and no GPS position in the original or any size", () => {
    const latitude = Buffer.alloc(24);
    GPS_MARK.latitude.forEach((v, i) => {
      latitude.writeUInt32BE(v, i * 8);
      latitude.writeUInt32BE(1, i * 8 + 4);
    });
    expect(upload.includes(latitude)).toBe(true);
    for (const image of [out.original, out.sizes.thumb, out.sizes.listing, out.sizes.zoom]) {
      expect(jpegHeaderMarkers(image.body).filter((m) => /^E[1-9A-F]$|^FE$/.test(m))).toEqual([]); // APP1–15, COM
      expect(image.body.includes(Buffer.from("Exif\0"))).toBe(false);
      expect(image.body.includes(latitude)).toBe(false);
    }
  });

  it("makes three JPEG sizes by long edge (400, 1200, 2400 px) and never enlarges", async () => {
    expect(out.sizes.thumb).toMatchObject({ contentType: "image/jpeg", width: 200, height: 400 });
    expect(out.sizes.listing).toMatchObject({ width: 600, height: 1200 });
    expect(out.sizes.zoom).toMatchObject({ width: 700, height: 1400 }); // under 2400: kept, not enlarged

    const small = await renderPhoto(await twoToneJpeg(300, 200), "image/jpeg");
    for (const size of [small.sizes.thumb, small.sizes.listing, small.sizes.zoom]) {
      expect([size.width, size.height]).toEqual([300, 200]);
    }
  });

  it("gives the same picture nearly the same 64-bit hash at another size and quality, and another picture a distant one", async () => {
    // Common practice for 64-bit DCT hashes: up to about 10 differing bits reads as "the same photo".
    const a = await renderPhoto(await sceneJpeg(7, 480, 360, 92), "image/jpeg");
    const b = await renderPhoto(await sceneJpeg(7, 240, 180, 55), "image/jpeg");
    const c = await renderPhoto(await sceneJpeg(8, 480, 360, 92), "image/jpeg");
    expect(a.phash).toMatch(/^[0-9a-f]{16}$/);
    expect(phashDistance(a.phash, b.phash)).toBeLessThanOrEqual(4);
    expect(phashDistance(a.phash, c.phash)).toBeGreaterThan(10);
  });

  it("keeps a PNG original as PNG without its text chunks, and makes JPEG sizes on white", async () => {
    const png = withPngText(await plainPng(500, 300, 0x6a412700), "Location", "Workshop 3, Elmbridge Lane");
    expect(pngChunkTypes(png)).toContain("tEXt");
    const r = await renderPhoto(png, "image/png");
    expect(r.original.contentType).toBe("image/png");
    expect(pngChunkTypes(r.original.body)).toEqual(["IHDR", "IDAT", "IEND"]);
    expect(r.original.body.includes(Buffer.from("Elmbridge"))).toBe(false);
    expect(r.sizes.thumb).toMatchObject({ contentType: "image/jpeg", width: 400, height: 240 });
    // Fully transparent pixels come out white, not the JPEG encoder's black.
    const band = await bandColour(r.sizes.thumb.body, 0.5);
    expect(band.red).toBeGreaterThan(240);
    expect(band.blue).toBeGreaterThan(240);
  });

  it("phashDistance counts differing bits", () => {
    expect(phashDistance("0000000000000000", "0000000000000000")).toBe(0);
    expect(phashDistance("ffffffffffffffff", "0000000000000000")).toBe(64);
    expect(phashDistance("8000000000000001", "0000000000000000")).toBe(2);
  });
});
