import { shrink, type Bitmap } from "~/photos/pixels.server";
import { encodeJpeg } from "~/photos/jpeg-encode.server";
import { decodeSequentialJpeg } from "~/photos/jpeg-decode.server";

// The edits a copied photo may have gone through, for measuring the perceptual hash against them.

export function crop(b: Bitmap, left: number, top: number, width: number, height: number): Bitmap {
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++)
    b.data.copy(data, y * width * 4, ((top + y) * b.width + left) * 4, ((top + y) * b.width + left + width) * 4);
  return { data, width, height };
}

export const PHOTO_EDITS: Record<string, { label: string; apply: (b: Bitmap) => Bitmap }> = {
  resized: { label: "resized to half", apply: (b) => shrink(b, Math.round(b.width / 2), Math.round(b.height / 2)) },
  quality50: { label: "recompressed as JPEG at quality 50", apply: (b) => decodeSequentialJpeg(encodeJpeg(b, { quality: 50 })) },
  cropped: {
    label: "cropped 5 % (2.5 % off each edge)",
    apply: (b) => {
      const w = Math.round(b.width * 0.95);
      const h = Math.round(b.height * 0.95);
      return crop(b, Math.round((b.width - w) / 2), Math.round((b.height - h) / 2), w, h);
    },
  },
  croppedOneSide: {
    label: "cropped 5 % off the left and top edges only",
    apply: (b) => {
      const w = Math.round(b.width * 0.95);
      const h = Math.round(b.height * 0.95);
      return crop(b, b.width - w, b.height - h, w, h);
    },
  },
  brightened: {
    label: "brightened by 32 levels of 255",
    apply: (b) => {
      const data = Buffer.from(b.data);
      for (let i = 0; i < data.length; i += 4) for (let k = 0; k < 3; k++) data[i + k] = Math.min(255, data[i + k] + 32);
      return { data, width: b.width, height: b.height };
    },
  },
};

/** Smallest, median and largest of some distances, for test names and the report. */
export function spread(xs: number[]): { min: number; median: number; max: number } {
  const s = [...xs].sort((a, b) => a - b);
  return { min: s[0], median: s[Math.floor((s.length - 1) / 2)], max: s[s.length - 1] };
}

export type CorpusPhoto = { serial: string; view: number; thumb: Bitmap; full: Buffer; phash: string };

/**
 * Every distinct demo photo (each unit once, every view), as the seed stores it: the thumbnail the
 * pipeline hashes, decoded, and the full-size JPEG. Drawn once, then read from the seed's cache.
 */
export async function demoPhotoCorpus(): Promise<CorpusPhoto[]> {
  const { DEMO_UNITS } = await import("../../db/seeds/demo-data");
  const { MORE_DEMO_UNITS } = await import("../../db/seeds/demo-data-more");
  const { SEARCH_DEMO_UNITS } = await import("../../db/seeds/demo-data-search");
  const { drawDemoPhotos } = await import("../../db/seeds/demo-photo-files");
  const all = [...DEMO_UNITS, ...MORE_DEMO_UNITS, ...SEARCH_DEMO_UNITS];
  const units = all.filter((u, i) => all.findIndex((v) => v.serial === u.serial) === i);
  const jobs = units.flatMap((u) => Array.from({ length: u.photos ?? 1 }, (_, view) => ({ category: u.category, key: u.serial, view })));
  const files = await drawDemoPhotos(jobs);
  return jobs.map((job, i) => ({
    serial: job.key,
    view: job.view,
    thumb: decodeSequentialJpeg(files[i].thumb),
    full: files[i].full,
    phash: files[i].phash,
  }));
}
