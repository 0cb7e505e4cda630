import type { Category } from "@shared/catalogue";
import { Canvas, hex, prng, shade, type RGB } from "./raster";

// Product pictures for the demo scenario, drawn from scratch: a front panel with knobs and meters for
// electronics, a plinth and platter for turntables, cabinets with drivers for loudspeakers. Every
// listing gets its own proportions, finish, layout and setting (seeded by its key), so the
// perceptual hashes differ the way real photos of different units would.

export const PHOTO_W = 1024;
export const PHOTO_H = 768;

const WALLS = ["#efe6d6", "#e6e0d2", "#e9dfcf", "#dfe3dc", "#eadbd0", "#e2dcd6", "#f1e9dc"].map(hex);
const TABLES = ["#7a4f31", "#93653f", "#5e3b24", "#a47a52", "#d9cdb8", "#6d5a48"].map(hex);
const FACES: Record<string, RGB> = {
  silver: hex("#c8c5be"),
  black: hex("#2b2825"),
  champagne: hex("#cfbd97"),
  graphite: hex("#55524e"),
};
const WOODS = ["#6a4127", "#8a5a34", "#4d2f1c", "#9b6a3f", "#3b2a20"].map(hex);
const AMBER = hex("#f2c66a");

type Rand = () => number;
const between = (r: Rand, a: number, b: number) => a + (b - a) * r();
const choose = <T>(r: Rand, xs: readonly T[]): T => xs[Math.floor(r() * xs.length) % xs.length];

/**
 * Draws the unit's picture. The unit's looks come from its key alone; the room and where the unit
 * stands come from (key, view), so a second view shows the same unit photographed elsewhere.
 */
export function drawUnit(category: Category, key: string, view = 0): Canvas {
  const r = prng(`${category}:${key}:unit`);
  const p = prng(`${category}:${key}:view:${view}`);
  const data = new Uint8Array(PHOTO_W * PHOTO_H * 4);
  const cv = new Canvas(PHOTO_W, PHOTO_H, data);
  const horizon = Math.round(PHOTO_H * between(p, 0.56, 0.74));
  setting(cv, p, horizon);
  if (category === "turntable") turntable(cv, r, p, horizon);
  else if (category === "loudspeaker") loudspeakers(cv, r, p, horizon);
  else electronics(cv, r, p, horizon, category);
  return cv;
}

function setting(cv: Canvas, r: Rand, horizon: number) {
  const wall = shade(choose(r, WALLS), between(r, -0.18, 0.06));
  const table = choose(r, TABLES);
  const lightX = between(r, 0.05, 0.95) * cv.width;
  const lightY = between(r, -0.2, 0.4) * cv.height;
  const grain = between(r, 0.02, 0.07);
  const grainFreq = between(r, 0.02, 0.06);
  const seedPhase = r() * 100;
  // Daylight from a window: a soft slanted band across the wall, somewhere different in every shot.
  const beamX = between(r, -0.3, 1.1) * cv.width;
  const beamW = between(r, 0.12, 0.35) * cv.width;
  const beamSlant = between(r, -0.6, 0.6);
  const beamStrength = between(r, 0.06, 0.2);
  const sideDark = between(r, -0.16, 0.16);
  // Written straight into the buffer: this covers every pixel, so no per-pixel closures or arrays.
  const d = cv.data;
  const W = cv.width;
  const reach = cv.width * 0.7;
  for (let y = 0; y < cv.height; y++) {
    const onWall = y < horizon;
    const v = onWall ? y / horizon : (y - horizon) / (cv.height - horizon);
    // Base colour for the row: the wall darkens towards the table, the table towards the camera.
    const base = onWall ? shade(wall, -0.14 * v) : shade(table, 0.1 - 0.32 * v);
    const grainRow = y * grainFreq * 3;
    for (let x = 0; x < W; x++) {
      const u = x / W;
      let f = -Math.max(0, sideDark * (u - 0.5) * 2);
      if (onWall) {
        const dx = x - lightX;
        const dy = y - lightY;
        const glow = 1 - Math.sqrt(dx * dx + dy * dy) / reach;
        if (glow > 0) f += glow * 0.3;
        const bx = Math.abs(x - beamX - y * beamSlant) / beamW;
        if (bx < 1) f += (1 - bx) * (1 - bx) * beamStrength;
      } else {
        f += Math.sin(grainRow + Math.sin(x * 0.004 + seedPhase) * 2.2) * grain;
      }
      const i = (y * W + x) * 4;
      if (f >= 0) {
        d[i] = base[0] + (255 - base[0]) * f;
        d[i + 1] = base[1] + (255 - base[1]) * f;
        d[i + 2] = base[2] + (255 - base[2]) * f;
      } else {
        d[i] = base[0] * (1 + f);
        d[i + 1] = base[1] * (1 + f);
        d[i + 2] = base[2] * (1 + f);
      }
      d[i + 3] = 255;
    }
  }
  cv.paint(0, horizon - 2, cv.width, 4, () => shade(table, -0.35), 0.6);
}

function knob(cv: Canvas, x: number, y: number, rad: number, metal: RGB, angle: number) {
  cv.ellipse(x + rad * 0.08, y + rad * 0.12, rad * 1.08, rad * 1.08, [15, 10, 6], 0.35);
  cv.ellipse(x, y, rad, rad, (u, v) => shade(metal, -0.25 + 0.45 * (1 - (u + v + 1) / 3)));
  cv.ellipse(x, y, rad * 0.78, rad * 0.78, (u, v) => shade(metal, 0.15 - 0.3 * ((u + v + 2) / 4)));
  const dx = Math.cos(angle) * rad * 0.6;
  const dy = Math.sin(angle) * rad * 0.6;
  cv.line(x + dx * 0.35, y + dy * 0.35, x + dx, y + dy, Math.max(2, rad * 0.1), shade(metal, -0.6));
}

function meter(cv: Canvas, x: number, y: number, w: number, h: number, r: Rand) {
  cv.roundRect(x - 3, y - 3, w + 6, h + 6, 6, [25, 20, 16]);
  cv.roundRect(x, y, w, h, 4, (u, v) => shade(AMBER, 0.1 - 0.35 * Math.hypot(u - 0.5, (v - 0.8) * 0.8)));
  const cx = x + w / 2;
  const cy = y + h * 1.05;
  const rad = h * 0.85;
  for (let i = 0; i <= 10; i++) {
    const a = Math.PI * (1.2 + 0.6 * (i / 10));
    const inner = i % 5 === 0 ? 0.78 : 0.85;
    cv.line(
      cx + Math.cos(a) * rad * inner,
      cy + Math.sin(a) * rad * inner,
      cx + Math.cos(a) * rad,
      cy + Math.sin(a) * rad,
      2,
      i > 7 ? hex("#a3392b") : [40, 30, 20],
    );
  }
  const a = Math.PI * (1.2 + 0.6 * between(r, 0.15, 0.75));
  cv.line(cx, cy, cx + Math.cos(a) * rad * 0.98, cy + Math.sin(a) * rad * 0.98, 2.5, [30, 22, 15]);
}

function electronics(cv: Canvas, r: Rand, p: Rand, horizon: number, category: Category) {
  const widths: Partial<Record<Category, [number, number]>> = {
    phono_stage: [0.42, 0.56],
    receiver: [0.8, 0.92],
    preamplifier: [0.68, 0.84],
  };
  const heights: Partial<Record<Category, [number, number]>> = {
    integrated_amplifier: [0.24, 0.32],
    power_amplifier: [0.3, 0.4],
    preamplifier: [0.14, 0.2],
    receiver: [0.24, 0.3],
    phono_stage: [0.28, 0.4],
    tape_deck: [0.3, 0.38],
  };
  const [w0, w1] = widths[category] ?? [0.66, 0.86];
  const [h0, h1] = heights[category] ?? [0.25, 0.32];
  const bw = cv.width * between(p, w0, w1);
  const bh = bw * between(r, h0, h1);
  const cx = cv.width / 2 + between(p, -1, 1) * ((cv.width - bw) / 2) * 0.7;
  const bottom = horizon + cv.height * between(p, 0.1, 0.2);
  const x0 = cx - bw / 2;
  const y0 = bottom - bh;
  const finish = choose(r, Object.keys(FACES));
  const face = FACES[finish];
  const cheeks = r() < 0.45;
  const wood = choose(r, WOODS);
  const topH = bh * between(r, 0.1, 0.18);

  cv.shadow(cx, bottom + 6, bw * 0.62, bh * 0.22, 0.55);
  // Top surface seen from slightly above, then the front panel.
  cv.roundRect(x0 + bw * 0.02, y0 - topH, bw * 0.96, topH + 4, 4, (_u, v) => shade(cheeks ? wood : face, -0.05 - 0.15 * v));
  const streak = finish === "silver" || finish === "champagne";
  cv.roundRect(x0, y0, bw, bh, 6, (u, v) => {
    const brushed = streak ? Math.sin(v * 900 + Math.sin(u * 9) * 0.6) * 0.025 : 0;
    return shade(face, 0.06 - 0.14 * v + brushed);
  });
  if (cheeks) {
    const cw = bw * 0.045;
    cv.roundRect(x0 - cw * 0.5, y0 - topH, cw, bh + topH, 4, (_u, v) => shade(wood, 0.05 - 0.2 * v));
    cv.roundRect(x0 + bw - cw * 0.5, y0 - topH, cw, bh + topH, 4, (_u, v) => shade(wood, 0.05 - 0.2 * v));
  }
  for (const fx of [0.12, 0.88]) cv.roundRect(x0 + bw * fx - 14, bottom - 2, 28, 10, 3, [24, 20, 16]);

  const metal = finish === "black" || finish === "graphite" ? hex("#8d8a85") : shade(face, -0.05);
  const ink: RGB = finish === "black" || finish === "graphite" ? [210, 200, 185] : [60, 52, 44];
  const pad = bw * 0.06;
  const midY = y0 + bh * 0.58;

  if (category === "receiver") {
    const dialH = bh * 0.34;
    const dialW = bw * between(r, 0.55, 0.68);
    const dx = x0 + pad;
    const dy = y0 + bh * 0.12;
    cv.roundRect(dx - 4, dy - 4, dialW + 8, dialH + 8, 5, [22, 18, 14]);
    cv.roundRect(dx, dy, dialW, dialH, 3, (u, v) => shade(AMBER, -0.05 - 0.3 * Math.abs(v - 0.5) - 0.15 * Math.abs(u - 0.5)));
    for (let i = 0; i <= 40; i++)
      cv.line(dx + (dialW * i) / 40, dy + dialH * 0.62, dx + (dialW * i) / 40, dy + dialH * (i % 5 ? 0.74 : 0.82), 1.5, [60, 40, 20]);
    const ptr = dx + dialW * between(r, 0.1, 0.9);
    cv.line(ptr, dy + 4, ptr, dy + dialH - 4, 3, hex("#b23a2a"));
    meter(cv, dx + dialW + pad * 0.6, dy, bw - dialW - pad * 2.6, dialH, r);
    const n = 4 + Math.floor(r() * 4);
    for (let i = 0; i < n; i++) knob(cv, x0 + pad + bh * 0.12 + (i * (bw * 0.62)) / n, y0 + bh * 0.74, bh * 0.09, metal, r() * 6.28);
    knob(cv, x0 + bw - pad - bh * 0.17, y0 + bh * 0.72, bh * 0.17, metal, r() * 6.28);
  } else if (category === "tape_deck") {
    const ww = bw * between(r, 0.38, 0.46);
    const wx = x0 + pad;
    const wy = y0 + bh * 0.1;
    const wh = bh * 0.6;
    cv.roundRect(wx, wy, ww, wh, 6, (_u, v) => shade(hex("#1f1c1a"), 0.08 - 0.1 * v));
    cv.roundRect(wx + ww * 0.12, wy + wh * 0.22, ww * 0.76, wh * 0.52, 4, hex("#d9d0c0"), 0.85);
    for (const fx of [0.33, 0.67]) {
      cv.ellipse(wx + ww * fx, wy + wh * 0.48, wh * 0.13, wh * 0.13, hex("#f4efe6"));
      cv.ellipse(wx + ww * fx, wy + wh * 0.48, wh * 0.05, wh * 0.05, hex("#3b3430"));
    }
    const mw = (bw - ww - pad * 3.2) / 2;
    meter(cv, wx + ww + pad, wy, mw, wh * 0.55, r);
    meter(cv, wx + ww + pad * 1.4 + mw, wy, mw, wh * 0.55, r);
    for (let i = 0; i < 6; i++)
      cv.roundRect(wx + i * (ww / 6) + 3, y0 + bh * 0.78, ww / 6 - 6, bh * 0.12, 3, shade(metal, -0.1 - 0.05 * (i % 2)));
    knob(cv, x0 + bw - pad - bh * 0.12, y0 + bh * 0.83, bh * 0.1, metal, r() * 6.28);
    knob(cv, x0 + bw - pad - bh * 0.42, y0 + bh * 0.83, bh * 0.1, metal, r() * 6.28);
  } else if (category === "power_amplifier") {
    const mw = bw * between(r, 0.22, 0.28);
    const mh = bh * 0.42;
    const gap = bw * 0.04;
    meter(cv, cx - mw - gap / 2, y0 + bh * 0.14, mw, mh, r);
    meter(cv, cx + gap / 2, y0 + bh * 0.14, mw, mh, r);
    cv.roundRect(x0 + pad, y0 + bh * 0.72, bh * 0.16, bh * 0.12, 3, shade(metal, -0.2));
    cv.ellipse(x0 + pad + bh * 0.3, y0 + bh * 0.78, 5, 5, hex("#d86b3d"));
    knob(cv, x0 + bw - pad - bh * 0.1, y0 + bh * 0.78, bh * 0.09, metal, r() * 6.28);
    knob(cv, x0 + bw - pad - bh * 0.36, y0 + bh * 0.78, bh * 0.09, metal, r() * 6.28);
    for (const hx of [0.02, 0.98]) cv.roundRect(x0 + bw * hx - 8, y0 + bh * 0.15, 16, bh * 0.7, 8, shade(metal, 0.1));
  } else {
    // Integrated amplifiers, preamplifiers and phono stages: a row of controls and a main knob.
    const big = category === "phono_stage" ? bh * 0.2 : bh * between(r, 0.22, 0.3);
    const bigX = r() < 0.7 ? x0 + bw - pad - big : x0 + pad + big;
    const withMeters = category === "integrated_amplifier" && r() < 0.4;
    if (withMeters) {
      const mw = bw * 0.16;
      meter(cv, cx - mw - 6, y0 + bh * 0.12, mw, bh * 0.36, r);
      meter(cv, cx + 6, y0 + bh * 0.12, mw, bh * 0.36, r);
    }
    knob(cv, bigX, midY - bh * 0.05, big, metal, r() * 6.28);
    const n = category === "phono_stage" ? 1 + Math.floor(r() * 2) : 3 + Math.floor(r() * 4);
    const rowY = withMeters ? y0 + bh * 0.74 : midY + bh * between(r, -0.05, 0.12);
    const span = bw - pad * 2 - big * 2.6;
    const startX = bigX > cx ? x0 + pad : x0 + pad + big * 2.6;
    for (let i = 0; i < n; i++) {
      knob(cv, startX + bh * 0.1 + (i * span) / Math.max(n, 1), rowY, bh * (category === "preamplifier" ? 0.16 : 0.085), metal, r() * 6.28);
    }
    if (category !== "phono_stage") cv.ellipse(startX + bh * 0.1, y0 + bh * 0.22, bh * 0.045, bh * 0.045, [20, 16, 12]);
    cv.ellipse(bigX > cx ? x0 + pad * 0.7 : x0 + bw - pad * 0.7, y0 + bh * 0.2, 4, 4, hex(choose(r, ["#e35b3a", "#6fcf6f", "#f0b04a"])));
  }
  // A maker's badge: a small plate in the panel's ink colour.
  cv.roundRect(x0 + bw * between(r, 0.3, 0.6), y0 + bh * 0.06, bw * 0.12, bh * 0.05, 2, ink, 0.55);
}

function turntable(cv: Canvas, r: Rand, p: Rand, horizon: number) {
  const pw = cv.width * between(p, 0.68, 0.84);
  const frontH = cv.height * between(r, 0.07, 0.11);
  const topH = cv.height * between(r, 0.28, 0.36);
  const cx = cv.width / 2 + between(p, -1, 1) * ((cv.width - pw) / 2) * 0.7;
  const bottom = horizon + cv.height * between(p, 0.12, 0.2);
  const x0 = cx - pw / 2;
  const topY = bottom - frontH - topH;
  const woodPlinth = r() < 0.6;
  const plinth = woodPlinth ? choose(r, WOODS) : hex(choose(r, ["#2a2724", "#3a3733", "#cfc8bb"]));

  cv.shadow(cx, bottom + 6, pw * 0.6, frontH * 0.8, 0.55);
  cv.roundRect(x0, topY, pw, topH + 6, 8, (u, v) => shade(plinth, 0.12 - 0.12 * v + (woodPlinth ? Math.sin(u * 70 + v * 4) * 0.03 : 0)));
  cv.roundRect(x0, bottom - frontH, pw, frontH, 6, (_u, v) => shade(plinth, -0.12 - 0.18 * v));

  const platX = x0 + pw * between(r, 0.36, 0.44);
  const platY = topY + topH * 0.52;
  const prx = pw * between(r, 0.3, 0.34);
  const pry = topH * 0.44;
  cv.ellipse(platX, platY + pry * 0.12, prx, pry, shade(hex("#1a1816"), 0.05));
  cv.ellipse(platX, platY, prx, pry, (u, v) => shade(hex("#8d8a86"), 0.2 - 0.2 * (u + v)));
  const hasRecord = r() < 0.7;
  const disc = hasRecord ? hex("#161412") : hex("#2c2a28");
  cv.ellipse(platX, platY - 2, prx * 0.94, pry * 0.94, disc);
  if (hasRecord) {
    for (let k = 0.45; k < 0.92; k += 0.06) cv.ellipse(platX, platY - 2, prx * k, pry * k, [60, 56, 52], 0.25);
    const label = hex(choose(r, ["#b4472f", "#e2c36a", "#4d6f8f", "#efe8d8", "#4f7d57"]));
    cv.ellipse(platX, platY - 2, prx * 0.3, pry * 0.3, label);
  }
  cv.ellipse(platX, platY - 3, 5, 4, hex("#d8d4cc"));

  const pivX = x0 + pw * between(r, 0.8, 0.86);
  const pivY = topY + topH * between(r, 0.28, 0.38);
  cv.ellipse(pivX, pivY, pw * 0.035, pw * 0.03, hex("#6f6b66"));
  cv.ellipse(pivX, pivY, pw * 0.02, pw * 0.017, hex("#c9c5be"));
  const tipX = platX + prx * between(r, 0.55, 0.75);
  const tipY = platY + pry * between(r, -0.1, 0.25);
  cv.line(pivX, pivY, tipX, tipY, 6, hex("#cfcbc4"));
  cv.line(tipX, tipY, tipX - 22, tipY + 8, 12, hex("#2a2725"));
  cv.line(pivX, pivY, pivX + 30, pivY - 24, 9, hex("#9a968f"));
  cv.ellipse(pivX + 32, pivY - 26, 14, 12, hex("#55524e"));
  // Speed buttons and a strobe dot on the plinth front.
  for (let i = 0; i < 2; i++) cv.roundRect(x0 + pw * 0.08 + i * 52, bottom - frontH * 0.65, 40, frontH * 0.3, 4, hex("#d5d0c6"));
  cv.ellipse(x0 + pw * 0.92, bottom - frontH * 0.5, 5, 5, hex("#e35b3a"));
}

function loudspeakers(cv: Canvas, r: Rand, p: Rand, horizon: number) {
  const pair = r() < 0.75;
  const floor = r() < 0.4;
  const cw = cv.width * (floor ? between(r, 0.19, 0.23) : between(r, 0.23, 0.29));
  const wanted = floor ? cv.height * between(r, 0.72, 0.8) : cw * between(r, 1.35, 1.7);
  const bottom = horizon + cv.height * between(p, 0.08, 0.16);
  // Tall cabinets stay inside the frame, with a little wall above them.
  const ch = Math.min(wanted, bottom - cv.height * 0.06);
  const veneer = choose(r, [...WOODS, hex("#2a2724")]);
  const baffle = r() < 0.5 ? shade(veneer, -0.35) : hex(choose(r, ["#1e1c1a", "#d9d0c0", "#3a3631"]));
  const grille = r() < 0.35;
  const gap = cv.width * between(p, 0.08, 0.16);
  const centres = pair
    ? [cv.width / 2 - gap / 2 - cw / 2, cv.width / 2 + gap / 2 + cw / 2]
    : [cv.width / 2 + cv.width * between(p, -0.1, 0.1)];
  const woofer = between(r, 0.33, 0.4);
  const withMid = r() < 0.45;
  const port = r() < 0.5;
  centres.forEach((cx, i) => {
    const x0 = cx - cw / 2;
    const y0 = bottom - ch;
    cv.shadow(cx, bottom + 4, cw * 0.75, cw * 0.12, 0.5);
    cv.roundRect(x0 - cw * 0.06, y0 + 4, cw * 0.1, ch - 4, 4, (_u, v) => shade(veneer, -0.25 - 0.1 * v));
    cv.roundRect(x0, y0, cw, ch, 5, (u, v) => shade(veneer, 0.1 - 0.2 * v + Math.sin(u * 40 + v * 6) * 0.03));
    const inset = cw * 0.06;
    cv.roundRect(x0 + inset, y0 + inset, cw - inset * 2, ch - inset * 2, 4, baffle);
    if (grille && i === 0) {
      cv.roundRect(x0 + inset, y0 + inset, cw - inset * 2, ch - inset * 2, 4, (u, v) =>
        shade(hex("#4a4440"), Math.sin(u * 300) * 0.03 + Math.sin(v * 300) * 0.03),
      );
      return;
    }
    const wr = cw * woofer;
    const wy = y0 + ch - inset - wr * 1.25 - (floor ? ch * 0.08 : 0);
    driver(cv, cx, wy, wr);
    if (floor) driver(cv, cx, wy - wr * 2.3, wr * 0.95);
    let ty = y0 + inset + cw * 0.2;
    if (withMid) {
      driver(cv, cx, ty + cw * 0.12, cw * 0.17);
      ty += cw * 0.38;
      ty = Math.min(ty, wy - wr * 1.3);
    }
    cv.ellipse(cx, withMid ? y0 + inset + cw * 0.12 : ty, cw * 0.07, cw * 0.07, hex("#2a2623"));
    cv.ellipse(cx, withMid ? y0 + inset + cw * 0.12 : ty, cw * 0.045, cw * 0.045, (u, v) => shade(hex("#bdb6aa"), 0.2 - 0.2 * (u + v)));
    if (port) cv.ellipse(cx, y0 + ch - inset - cw * 0.12, cw * 0.09, cw * 0.05, hex("#0d0c0b"));
  });
}

function driver(cv: Canvas, x: number, y: number, rad: number) {
  cv.ellipse(x, y, rad * 1.06, rad * 1.06, hex("#121110"));
  cv.ellipse(x, y, rad, rad, (u, v) => shade(hex("#3a3633"), 0.15 - 0.15 * (u + v)));
  cv.ellipse(x, y, rad * 0.84, rad * 0.84, (u, v) => shade(hex("#26221f"), 0.1 * Math.hypot(u, v) - 0.05 * (u + v)));
  cv.ellipse(x, y, rad * 0.3, rad * 0.3, (u, v) => shade(hex("#4a4440"), 0.25 - 0.2 * (u + v)));
}
