// Entropy decoding for the JPEG decoder (ITU-T T.81, Annex F.2.2): canonical Huffman tables with
// a lookup for short codes, and a bit reader over entropy-coded data.

/** Thrown for image data that cannot be decoded; the message finishes a sentence for the seller. */
export class JpegDataProblem extends Error {}

export type Table = { lookup: Int32Array; maxCode: Int32Array; offset: Int32Array; symbols: Uint8Array };

const LOOKAHEAD = 9;

// Canonical codes (Annex C) with a table for codes of up to 9 bits and the F.2.2.3 limits beyond.
export function buildTable(counts: Uint8Array, symbols: Uint8Array): Table {
  const lookup = new Int32Array(1 << LOOKAHEAD);
  const maxCode = new Int32Array(18).fill(-1);
  const offset = new Int32Array(18);
  let code = 0;
  let k = 0;
  for (let len = 1; len <= 16; len++) {
    offset[len] = k - code;
    for (let i = 0; i < counts[len - 1]; i++, code++, k++) {
      if (len <= LOOKAHEAD) {
        const shift = LOOKAHEAD - len;
        for (let fill = 0; fill < 1 << shift; fill++) lookup[(code << shift) | fill] = (len << 8) | symbols[k];
      }
    }
    maxCode[len] = counts[len - 1] ? code - 1 : -1;
    code <<= 1;
  }
  maxCode[17] = 0x7fffffff;
  return { lookup, maxCode, offset, symbols };
}

/** Reads entropy-coded bits; 0xFF 0x00 is a data byte, any other marker ends the data (zeros after). */
export class BitReader {
  acc = 0;
  count = 0;
  atMarker = false;
  constructor(
    private readonly b: Buffer,
    public pos: number,
  ) {}

  private fill() {
    while (this.count <= 16) {
      let byte = 0;
      if (!this.atMarker && this.pos < this.b.length) {
        byte = this.b[this.pos];
        if (byte === 0xff) {
          const next = this.b[this.pos + 1];
          if (next === 0x00) this.pos += 2;
          else {
            this.atMarker = true;
            byte = 0;
          }
        } else this.pos += 1;
      }
      this.acc = ((this.acc << 8) | byte) >>> 0;
      this.count += 8;
    }
  }

  bits(n: number): number {
    if (n === 0) return 0;
    this.fill();
    this.count -= n;
    const value = (this.acc >>> this.count) & ((1 << n) - 1);
    this.acc &= (1 << this.count) - 1;
    return value;
  }

  decode(t: Table): number {
    this.fill();
    const entry = t.lookup[(this.acc >>> (this.count - LOOKAHEAD)) & ((1 << LOOKAHEAD) - 1)];
    if (entry !== 0) {
      this.count -= entry >> 8;
      this.acc &= (1 << this.count) - 1;
      return entry & 0xff;
    }
    for (let len = LOOKAHEAD + 1; len <= 16; len++) {
      const code = (this.acc >>> (this.count - len)) & ((1 << len) - 1);
      if (code <= t.maxCode[len]) {
        this.count -= len;
        this.acc &= (1 << this.count) - 1;
        return t.symbols[t.offset[len] + code];
      }
    }
    throw new JpegDataProblem("its image data holds a code its Huffman tables do not define");
  }

  /** A coefficient of `size` bits (F.2.2.1, EXTEND). */
  value(size: number): number {
    const v = this.bits(size);
    return v < 1 << (size - 1) ? v - (1 << size) + 1 : v;
  }

  /** At a restart interval's end: drop the padding bits and step over the RSTn marker. */
  restart() {
    this.acc = 0;
    this.count = 0;
    this.atMarker = false;
    while (this.pos + 1 < this.b.length) {
      if (this.b[this.pos] === 0xff && this.b[this.pos + 1] >= 0xd0 && this.b[this.pos + 1] <= 0xd7) {
        this.pos += 2;
        return;
      }
      if (this.b[this.pos] === 0xff && this.b[this.pos + 1] !== 0x00 && this.b[this.pos + 1] !== 0xff) return;
      this.pos += 1;
    }
  }

  /** Where the next marker starts, once the scan is done. */
  end(): number {
    let p = this.pos;
    while (p + 1 < this.b.length && !(this.b[p] === 0xff && this.b[p + 1] !== 0x00 && !(this.b[p + 1] >= 0xd0 && this.b[p + 1] <= 0xd7)))
      p += 1;
    return p;
  }
}
