// A tiny anti-aliased rasteriser over an RGBA buffer, enough to draw the demo's product pictures.
// Shapes are filled by coverage (distance to the edge), so edges stay smooth without supersampling.

export type RGB = readonly [number, number, number];

export function hex(h: string): RGB {
  const n = parseInt(h.replace("#", ""), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

export function mix(a: RGB, b: RGB, t: number): RGB {
  return [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];
}

export function shade(c: RGB, f: number): RGB {
  return f >= 0 ? mix(c, [255, 255, 255], f) : mix(c, [0, 0, 0], -f);
}

/** Deterministic PRNG (mulberry32) so a listing's picture is the same on every seed run. */
export function prng(seedText: string): () => number {
  let h = 1779033703 ^ seedText.length;
  for (let i = 0; i < seedText.length; i++) {
    h = Math.imul(h ^ seedText.charCodeAt(i), 3432918353);
    h = (h << 13) | (h >>> 19);
  }
  let a = h >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export class Canvas {
  constructor(
    readonly width: number,
    readonly height: number,
    readonly data: Uint8Array,
  ) {}

  /** Blends `c` into pixel (x, y) with coverage `a` (0…1). */
  blend(x: number, y: number, c: RGB, a: number) {
    if (a <= 0 || x < 0 || y < 0 || x >= this.width || y >= this.height) return;
    const i = (y * this.width + x) * 4;
    const d = this.data;
    if (a >= 1) {
      d[i] = c[0];
      d[i + 1] = c[1];
      d[i + 2] = c[2];
    } else {
      d[i] += (c[0] - d[i]) * a;
      d[i + 1] += (c[1] - d[i + 1]) * a;
      d[i + 2] += (c[2] - d[i + 2]) * a;
    }
    d[i + 3] = 255;
  }

  /** Fills the box with a colour computed per pixel (u, v in 0…1 across the box). */
  paint(x0: number, y0: number, w: number, h: number, color: (u: number, v: number, x: number, y: number) => RGB, alpha = 1) {
    const xa = Math.max(0, Math.floor(x0));
    const ya = Math.max(0, Math.floor(y0));
    const xb = Math.min(this.width, Math.ceil(x0 + w));
    const yb = Math.min(this.height, Math.ceil(y0 + h));
    for (let y = ya; y < yb; y++) {
      const v = (y - y0) / h;
      for (let x = xa; x < xb; x++) this.blend(x, y, color((x - x0) / w, v, x, y), alpha);
    }
  }

  /** Rounded rectangle, optionally with a per-pixel colour. */
  roundRect(x0: number, y0: number, w: number, h: number, r: number, fill: RGB | ((u: number, v: number) => RGB), alpha = 1) {
    const xa = Math.max(0, Math.floor(x0) - 1);
    const ya = Math.max(0, Math.floor(y0) - 1);
    const xb = Math.min(this.width, Math.ceil(x0 + w) + 1);
    const yb = Math.min(this.height, Math.ceil(y0 + h) + 1);
    const cx = x0 + w / 2;
    const cy = y0 + h / 2;
    const hx = w / 2 - r;
    const hy = h / 2 - r;
    for (let y = ya; y < yb; y++) {
      for (let x = xa; x < xb; x++) {
        const qx = Math.abs(x + 0.5 - cx) - hx;
        const qy = Math.abs(y + 0.5 - cy) - hy;
        const outside = Math.hypot(Math.max(qx, 0), Math.max(qy, 0)) + Math.min(Math.max(qx, qy), 0) - r;
        const cov = Math.min(1, Math.max(0, 0.5 - outside));
        if (cov <= 0) continue;
        const c = typeof fill === "function" ? fill((x - x0) / w, (y - y0) / h) : fill;
        this.blend(x, y, c, cov * alpha);
      }
    }
  }

  /** Ellipse (circle when rx = ry), optionally with a per-pixel colour over (u, v) in −1…1. */
  ellipse(cx: number, cy: number, rx: number, ry: number, fill: RGB | ((u: number, v: number) => RGB), alpha = 1) {
    const xa = Math.max(0, Math.floor(cx - rx) - 1);
    const ya = Math.max(0, Math.floor(cy - ry) - 1);
    const xb = Math.min(this.width, Math.ceil(cx + rx) + 1);
    const yb = Math.min(this.height, Math.ceil(cy + ry) + 1);
    const rmin = Math.min(rx, ry);
    for (let y = ya; y < yb; y++) {
      for (let x = xa; x < xb; x++) {
        const u = (x + 0.5 - cx) / rx;
        const v = (y + 0.5 - cy) / ry;
        const d = Math.sqrt(u * u + v * v);
        const cov = Math.min(1, Math.max(0, (1 - d) * rmin + 0.5));
        if (cov <= 0) continue;
        this.blend(x, y, typeof fill === "function" ? fill(u, v) : fill, cov * alpha);
      }
    }
  }

  /** A line with round caps, `width` pixels thick. */
  line(x1: number, y1: number, x2: number, y2: number, width: number, c: RGB, alpha = 1) {
    const r = width / 2;
    const xa = Math.max(0, Math.floor(Math.min(x1, x2) - r) - 1);
    const ya = Math.max(0, Math.floor(Math.min(y1, y2) - r) - 1);
    const xb = Math.min(this.width, Math.ceil(Math.max(x1, x2) + r) + 1);
    const yb = Math.min(this.height, Math.ceil(Math.max(y1, y2) + r) + 1);
    const dx = x2 - x1;
    const dy = y2 - y1;
    const len2 = dx * dx + dy * dy || 1;
    for (let y = ya; y < yb; y++) {
      for (let x = xa; x < xb; x++) {
        const px = x + 0.5 - x1;
        const py = y + 0.5 - y1;
        const t = Math.max(0, Math.min(1, (px * dx + py * dy) / len2));
        const d = Math.hypot(px - t * dx, py - t * dy);
        const cov = Math.min(1, Math.max(0, r - d + 0.5));
        if (cov > 0) this.blend(x, y, c, cov * alpha);
      }
    }
  }

  /** A soft elliptical shadow (darkening that fades out), for objects standing on a surface. */
  shadow(cx: number, cy: number, rx: number, ry: number, strength: number) {
    const xa = Math.max(0, Math.floor(cx - rx));
    const ya = Math.max(0, Math.floor(cy - ry));
    const xb = Math.min(this.width, Math.ceil(cx + rx));
    const yb = Math.min(this.height, Math.ceil(cy + ry));
    for (let y = ya; y < yb; y++) {
      for (let x = xa; x < xb; x++) {
        const u = (x - cx) / rx;
        const v = (y - cy) / ry;
        const d = u * u + v * v;
        if (d < 1) this.blend(x, y, [20, 14, 8], strength * (1 - d) * (1 - d));
      }
    }
  }
}
