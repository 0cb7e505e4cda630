// A small seeded generator for the scale seed: the same seed and index give the same unit on any
// machine, so a bench run can be repeated and two runs compared.

/** sfc32: fast, 128 bits of state, good enough spread for made-up data. */
export class Rng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(...seeds: number[]) {
    // Mix every seed into the four words, then run the generator a little so close seeds diverge.
    let h = 0x9e3779b9;
    this.a = this.b = this.c = this.d = 0;
    for (const s of seeds) {
      h = Math.imul(h ^ (s >>> 0), 0x85ebca6b);
      h ^= h >>> 13;
      this.a = (this.a + h) | 0;
      this.b = (this.b ^ Math.imul(h, 0xc2b2ae35)) | 0;
      this.c = (this.c + (h >>> 7)) | 0;
      this.d = (this.d ^ (h << 3)) | 0;
    }
    this.d |= 1;
    for (let i = 0; i < 12; i++) this.next();
  }

  /** Uniform in [0, 1). */
  next(): number {
    const t = (((this.a + this.b) | 0) + this.d) | 0;
    this.d = (this.d + 1) | 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) | 0;
    this.c = (this.c << 21) | (this.c >>> 11);
    this.c = (this.c + t) | 0;
    return (t >>> 0) / 4294967296;
  }

  /** Uniform in [min, max). */
  range(min: number, max: number): number {
    return min + (max - min) * this.next();
  }

  /** A whole number in [min, max]. */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.next() * items.length)];
  }

  /** One of the keys, in proportion to its weight. */
  weighted<K extends string>(weights: Readonly<Record<K, number>>): K {
    const entries = Object.entries(weights) as [K, number][];
    let total = 0;
    for (const [, w] of entries) total += w;
    let x = this.next() * total;
    for (const [k, w] of entries) if ((x -= w) < 0) return k;
    return entries[entries.length - 1][0];
  }

  /** Normal, by Box–Muller. */
  normal(mean = 0, sd = 1): number {
    const u = 1 - this.next();
    const v = this.next();
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  }

  /** A positive figure spread by a factor: `median` × e^(N(0, spread)). */
  logNormal(median: number, spread: number): number {
    return median * Math.exp(this.normal(0, spread));
  }

  /** A version-4-shaped UUID from the stream: the seed decides every id, so reruns give the same rows. */
  uuid(): string {
    const hex = (n: number) =>
      Math.floor(this.next() * 16 ** n)
        .toString(16)
        .padStart(n, "0");
    const variant = (8 + this.int(0, 3)).toString(16);
    return `${hex(8)}-${hex(4)}-4${hex(3)}-${variant}${hex(3)}-${hex(12)}`;
  }
}
