import { AC_CHROMA, AC_LUMA, DC_CHROMA, DC_LUMA, ZIGZAG, huffmanCodes, type HuffmanSpec } from "./jpeg-tables";

// The JPEG encoder's entropy coding (ITU-T T.81, F.1.2): quantisation of a transformed block,
// Huffman codes from the typical tables of Annex K.3 and the bit packing with 0xFF stuffing.
// Nothing is allocated per block: Huffman codes are packed with their lengths, bits gather in a
// 32-bit accumulator and the output buffer's room is reserved per MCU, not checked per byte.

export class ByteWriter {
  buf: Uint8Array;
  length = 0;
  acc = 0;
  bits = 0;
  constructor(capacity: number) {
    this.buf = new Uint8Array(Math.max(1024, capacity));
  }
  /** Makes room for `n` more bytes; `put` itself does not check, so the block loop reserves per MCU. */
  reserve(n: number) {
    if (this.length + n <= this.buf.length) return;
    const next = new Uint8Array(Math.max(this.buf.length * 2, this.length + n));
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
  }
  byte(v: number) {
    this.reserve(1);
    this.buf[this.length++] = v;
  }
  u16(v: number) {
    this.byte(v >> 8);
    this.byte(v & 0xff);
  }
  bytes(a: ArrayLike<number>) {
    for (let i = 0; i < a.length; i++) this.byte(a[i]);
  }
  /**
   * The low `count` bits of `value` (count ≤ 24), most significant first, with 0xFF stuffed by 0x00.
   * Fewer than 8 bits wait between calls, so the accumulator never holds more than 31.
   */
  put(value: number, count: number) {
    let bits = this.bits + count;
    const acc = (this.acc << count) | (value & ((1 << count) - 1));
    const buf = this.buf;
    let at = this.length;
    while (bits >= 8) {
      bits -= 8;
      const b = (acc >>> bits) & 0xff;
      buf[at++] = b;
      if (b === 0xff) buf[at++] = 0;
    }
    this.length = at;
    this.acc = acc & ((1 << bits) - 1);
    this.bits = bits;
  }
  /** Pads the last byte with 1-bits (F.1.2.3). */
  flushBits() {
    this.reserve(2);
    if (this.bits > 0) this.put(0x7f, 8 - this.bits);
  }
}

/** Per symbol: its code length (Annex C) in bits 16 and up, the code below; 0 for an unused symbol. */
function packedCodes(spec: HuffmanSpec): Int32Array {
  const { code, length } = huffmanCodes(spec);
  return Int32Array.from(code, (c, symbol) => (length[symbol] << 16) | c);
}
export const PACKED = {
  dc: [packedCodes(DC_LUMA), packedCodes(DC_CHROMA)],
  ac: [packedCodes(AC_LUMA), packedCodes(AC_CHROMA)],
};

// A copy of its own: the hot loop then reads a local array, not an import binding.
const ZZ = Uint8Array.from(ZIGZAG);
// Quantised coefficients of the current block in zig-zag order.
const zz = new Int32Array(64);

/**
 * Quantises one transformed block and writes its Huffman-coded DC difference and AC runs (F.1.2);
 * returns the block's DC value, the next prediction. Each code goes out with its extra bits in one
 * `put` when together they fit 24 bits.
 */
export function codeBlock(out: ByteWriter, block: Float32Array, scale: Float32Array, dc: Int32Array, ac: Int32Array, pred: number): number {
  const value = Math.round(block[0] * scale[0]);
  let last = 0;
  for (let k = 1; k < 64; k++) {
    const z = ZZ[k];
    // Math.round(x) for x > −1024.5, as a truncation; anything lower is clamped to −1023 below anyway.
    const raw = ((block[z] * scale[z] + 1024.5) | 0) - 1024;
    const c = raw > 1023 ? 1023 : raw < -1023 ? -1023 : raw; // the tables code up to 10 bits
    zz[k] = c;
    if (c !== 0) last = k;
  }
  const diff = value - pred;
  const size = diff === 0 ? 0 : 32 - Math.clz32(diff < 0 ? -diff : diff);
  const d = dc[size];
  out.put(((d & 0xffff) << size) | ((diff < 0 ? diff - 1 : diff) & ((1 << size) - 1)), (d >>> 16) + size);
  let run = 0;
  for (let k = 1; k <= last; k++) {
    const c = zz[k];
    if (c === 0) {
      run += 1;
      continue;
    }
    while (run > 15) {
      const zrl = ac[0xf0];
      out.put(zrl, zrl >>> 16);
      run -= 16;
    }
    const s = 32 - Math.clz32(c < 0 ? -c : c);
    const code = ac[(run << 4) | s];
    const length = code >>> 16;
    const extra = (c < 0 ? c - 1 : c) & ((1 << s) - 1);
    if (length + s <= 24) out.put(((code & 0xffff) << s) | extra, length + s);
    else {
      out.put(code, length);
      out.put(extra, s);
    }
    run = 0;
  }
  if (last < 63) out.put(ac[0], ac[0] >>> 16); // end of block
  return value;
}
