import { describe, expect, it } from "vitest";
import { inspectPhoto } from "~/photos/inspect.server";
import { PhotoRefusal } from "~/photos/refusal.server";
import {
  bilevelPng,
  gifImage,
  mp3Audio,
  oversizeJpeg,
  plainPng,
  svgWithScript,
  textFile,
  twoToneJpeg,
  withExif,
} from "../../support/photo-files";

async function refusal(bytes: Uint8Array, name: string): Promise<PhotoRefusal> {
  try {
    await inspectPhoto(bytes, name);
  } catch (error) {
    if (error instanceof PhotoRefusal) return error;
    throw error;
  }
  throw new Error(`${name} was accepted`);
}

describe("inspectPhoto: what a seller may upload", { timeout: 20_000 }, () => {
  it("accepts a JPEG and reads its size from the frame header", async () => {
    const jpeg = withExif(await twoToneJpeg(320, 200), { orientation: 6 });
    await expect(inspectPhoto(jpeg, "amp-front.jpg")).resolves.toEqual({
      contentType: "image/jpeg",
      ext: "jpg",
      width: 320,
      height: 200,
      byteSize: jpeg.length,
    });
  });

  it("accepts a PNG, whatever it is named, and reads its size from IHDR", async () => {
    const png = await plainPng(300, 150);
    await expect(inspectPhoto(png, "rear-panel.jpeg")).resolves.toMatchObject({
      contentType: "image/png",
      width: 300,
      height: 150,
    });
  });

  it("refuses an empty file", async () => {
    const r = await refusal(new Uint8Array(0), "IMG_0001.jpg");
    expect(r.code).toBe("empty_file");
    expect(r.status).toBe(422);
    expect(r.message).toBe("“IMG_0001.jpg” is empty (0 bytes); choose the photo again.");
  });

  it("refuses a 30 MB file before looking inside", async () => {
    const r = await refusal(await oversizeJpeg(30 * 1024 * 1024), "panorama.jpg");
    expect(r.code).toBe("file_too_large");
    expect(r.status).toBe(413);
    expect(r.message).toBe("“panorama.jpg” is 30 MB; photos may be at most 20 MB.");
  });

  it("accepts exactly 20 MB and refuses one byte more", async () => {
    // Padded after EOI, which is allowed (cameras append data there).
    await expect(inspectPhoto(await oversizeJpeg(20 * 1024 * 1024), "a.jpg")).resolves.toMatchObject({ width: 64 });
    expect((await refusal(await oversizeJpeg(20 * 1024 * 1024 + 1), "b.jpg")).code).toBe("file_too_large");
  });

  it("refuses a text file renamed .jpg, saying what it really is", async () => {
    const r = await refusal(textFile(), "front-panel.jpg");
    expect(r.code).toBe("unsupported_type");
    expect(r.status).toBe(415);
    expect(r.message).toBe("“front-panel.jpg” cannot be used (named .jpg, but it is really a text file). Upload JPEG or PNG photos only.");
  });

  it("refuses an SVG with a script in it, and a plain SVG", async () => {
    const r = await refusal(svgWithScript(), "logo.png");
    expect(r.code).toBe("unsupported_type");
    expect(r.message).toContain("is really an SVG drawing with a script in it");
    const plain = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="4" height="4"/>');
    expect((await refusal(plain, "dial.svg")).message).toContain("is really an SVG drawing)");
  });

  it("refuses a WAV that is really an MP3, naming the MP3", async () => {
    const r = await refusal(mp3Audio(), "test-tone-1khz.wav");
    expect(r.code).toBe("unsupported_type");
    expect(r.message).toBe(
      "“test-tone-1khz.wav” cannot be used (named .wav, but it is really an MP3 audio file). Upload JPEG or PNG photos only.",
    );
  });

  it("refuses a GIF renamed .jpg", async () => {
    expect((await refusal(gifImage(), "knob.jpg")).message).toContain("it is really a GIF image");
  });

  it("refuses bytes it cannot recognise without guessing", async () => {
    const noise = Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 73 + 11) % 256));
    noise[0] = 0x00;
    expect((await refusal(noise, "scan.jpg")).message).toBe(
      "“scan.jpg” cannot be used (named .jpg, but it is not a photo we can recognise). Upload JPEG or PNG photos only.",
    );
  });

  it("refuses a 60-megapixel PNG from its header, before decoding", async () => {
    const png = bilevelPng(10_000, 6_000);
    const r = await refusal(png, "scan-600dpi.png");
    expect(r.code).toBe("too_many_pixels");
    expect(r.status).toBe(422);
    expect(r.message).toBe(
      "“scan-600dpi.png” is 10000 × 6000 pixels (60.0 megapixels); photos may have at most 50 megapixels. " +
        "Scale it down and upload it again.",
    );
  });

  it("accepts exactly 50 megapixels", async () => {
    await expect(inspectPhoto(bilevelPng(10_000, 5_000), "a.png")).resolves.toMatchObject({ width: 10_000 });
  });

  it("refuses a JPEG over 50 megapixels from its frame header alone", async () => {
    // Only the frame header is patched: the walk stops at the pixel count, before any decoding.
    const jpeg = Buffer.from(await twoToneJpeg(64, 48));
    const sof = jpeg.indexOf(Buffer.from([0xff, 0xc0]));
    jpeg.writeUInt16BE(8000, sof + 5);
    jpeg.writeUInt16BE(9000, sof + 7);
    expect((await refusal(jpeg, "big.jpg")).message).toContain("9000 × 8000 pixels (72.0 megapixels)");
  });

  it("refuses a truncated JPEG (cut inside the image data)", async () => {
    const jpeg = await twoToneJpeg(400, 300);
    const r = await refusal(jpeg.subarray(0, Math.floor(jpeg.length * 0.6)), "half.jpg");
    expect(r.code).toBe("truncated_file");
    expect(r.message).toBe(
      "“half.jpg” is a JPEG photo, but it looks cut short, perhaps by an interrupted copy or download. " + "Upload the complete file.",
    );
  });

  it("refuses a JPEG cut before its image data and one missing only its end marker", async () => {
    const jpeg = await twoToneJpeg(200, 100);
    const sos = jpeg.indexOf(Buffer.from([0xff, 0xda]));
    expect((await refusal(jpeg.subarray(0, sos), "a.jpg")).code).toBe("truncated_file");
    expect((await refusal(jpeg.subarray(0, jpeg.length - 2), "b.jpg")).code).toBe("truncated_file");
  });

  it("refuses a truncated PNG (no IEND) and one whose last chunk's CRC is wrong", async () => {
    const png = await plainPng(200, 100);
    const cut = await refusal(png.subarray(0, png.length - 12), "a.png");
    expect(cut.code).toBe("truncated_file");
    const bad = Buffer.from(png);
    bad[bad.length - 1] ^= 0xff;
    const r = await refusal(bad, "b.png");
    expect(r.code).toBe("damaged_file");
    expect(r.message).toBe(
      "“b.png” is a PNG photo, but it is damaged: the checksum of its IEND chunk is wrong. " + "Export it again and upload the new file.",
    );
  });

  it("refuses a JPEG coding the decoder cannot read (arithmetic coding) with advice", async () => {
    const jpeg = Buffer.from(await twoToneJpeg(64, 48));
    jpeg[jpeg.indexOf(Buffer.from([0xff, 0xc0])) + 1] = 0xc9;
    const r = await refusal(jpeg, "old-scan.jpg");
    expect(r.code).toBe("unsupported_type");
    expect(r.message).toBe(
      "“old-scan.jpg” is a JPEG photo, but it uses arithmetic coding, which we cannot read; " + "export it again as a standard JPEG.",
    );
  });
});
