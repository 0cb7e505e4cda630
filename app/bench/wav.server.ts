// WAV decoding: wavefile reads the container and the format chunk; the sample unpacking is ours,
// because a 10 s stereo 96 kHz capture is two million samples and must decode in milliseconds.
import wavefile from "wavefile";
import { CaptureError } from "@shared/bench/analysis";

const { WaveFile } = wavefile as unknown as { WaveFile: new () => WaveFileLike };

interface WaveFileLike {
  fromBuffer(bytes: Uint8Array, samples?: boolean): void;
  container: string;
  fmt: {
    audioFormat: number;
    numChannels: number;
    sampleRate: number;
    blockAlign: number;
    bitsPerSample: number;
    subformat?: number[];
  };
  data: { chunkSize: number; samples: Uint8Array };
}

export const SAMPLE_RATE_RANGE = { min: 44_100, max: 192_000 } as const;

const FORMAT_NAMES: Record<number, string> = {
  0x0002: "Microsoft ADPCM (compressed)",
  0x0006: "A-law (compressed)",
  0x0007: "µ-law (compressed)",
  0x0011: "IMA ADPCM (compressed)",
  0x0031: "GSM 6.10 (compressed)",
  0x0050: "MPEG audio (compressed)",
  0x0055: "MP3 (compressed)",
};

export interface WavFormat {
  container: "RIFF" | "RIFX" | "RF64";
  encoding: "pcm" | "float";
  bitDepth: 16 | 24 | 32;
  channels: 1 | 2;
  sampleRate: number;
  frames: number;
  durationS: number;
}

export interface DecodedWav extends WavFormat {
  /** One array per channel, scaled so that digital full scale is ±1. */
  samples: Float64Array[];
  /** Largest positive code as a fraction of full scale (32767/32768 for 16-bit). */
  positiveFullScale: number;
}

/** Read the header and check the format; throws CaptureError for anything we cannot measure from. */
export function readWavFormat(bytes: Uint8Array): { format: WavFormat; data: Uint8Array } {
  const wav = new WaveFile();
  try {
    // With samples: the data chunk's bytes come back as their own array (clamped to the file's end).
    wav.fromBuffer(bytes, true);
  } catch (e) {
    throw new CaptureError("not_wav", `The file starts like a WAV but cannot be read: ${e instanceof Error ? e.message : String(e)}.`);
  }
  const fmt = wav.fmt;
  let code = fmt.audioFormat;
  if (code === 0xfffe) code = fmt.subformat?.[0] ?? 0; // WAVE_FORMAT_EXTENSIBLE: the real format is in the sub-format GUID
  if (code !== 1 && code !== 3) {
    const name = FORMAT_NAMES[code] ?? `format code 0x${code.toString(16).padStart(4, "0")}`;
    throw new CaptureError(
      "unsupported_format",
      `The WAV holds ${name} audio; upload uncompressed PCM (16, 24 or 32-bit) or 32-bit float.`,
      { formatCode: code },
    );
  }
  const encoding = code === 1 ? "pcm" : "float";
  const bits = fmt.bitsPerSample;
  const okBits = encoding === "pcm" ? [16, 24, 32] : [32];
  if (!okBits.includes(bits)) {
    const what = encoding === "pcm" ? `${bits}-bit PCM` : `${bits}-bit float`;
    const why = encoding === "pcm" && bits < 16 ? " (too coarse to measure distortion)" : "";
    throw new CaptureError("unsupported_format", `The WAV is ${what}${why}; upload 16, 24 or 32-bit PCM, or 32-bit float.`, {
      bitDepth: bits,
      encoding,
    });
  }
  if (fmt.numChannels !== 1 && fmt.numChannels !== 2) {
    throw new CaptureError("unsupported_format", `The WAV has ${fmt.numChannels} channels; upload mono or stereo.`, {
      channels: fmt.numChannels,
    });
  }
  if (fmt.sampleRate < SAMPLE_RATE_RANGE.min || fmt.sampleRate > SAMPLE_RATE_RANGE.max) {
    throw new CaptureError(
      "unsupported_format",
      `The WAV is sampled at ${fmt.sampleRate} Hz; captures must be sampled between 44.1 and 192 kHz.`,
      { sampleRate: fmt.sampleRate },
    );
  }
  const frameBytes = fmt.numChannels * (bits / 8);
  if (fmt.blockAlign !== frameBytes) {
    throw new CaptureError(
      "not_wav",
      `The WAV header is inconsistent: ${fmt.blockAlign} bytes per frame for ${fmt.numChannels} × ${bits}-bit.`,
    );
  }
  // A recorder that stopped abruptly leaves a size that runs past the file; use what is there.
  const data = wav.data.samples;
  const frames = Math.floor(data.length / frameBytes);
  return {
    data,
    format: {
      container: wav.container as WavFormat["container"],
      encoding,
      bitDepth: bits as 16 | 24 | 32,
      channels: fmt.numChannels,
      sampleRate: fmt.sampleRate,
      frames,
      durationS: frames / fmt.sampleRate,
    },
  };
}

export function decodeWav(bytes: Uint8Array): DecodedWav {
  const { format, data: bytesIn } = readWavFormat(bytes);
  return decodeWavData(format, bytesIn);
}

/** Unpack the data chunk `readWavFormat` returned. */
export function decodeWavData(format: WavFormat, bytes: Uint8Array): DecodedWav {
  const { channels: nch, frames, bitDepth, encoding } = format;
  const le = format.container !== "RIFX";
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const samples = Array.from({ length: nch }, () => new Float64Array(frames));
  const bps = bitDepth / 8;
  let off = 0;
  if (encoding === "float") {
    for (let i = 0; i < frames; i++)
      for (let c = 0; c < nch; c++, off += 4) {
        const v = view.getFloat32(off, le);
        if (!Number.isFinite(v))
          throw new CaptureError("not_wav", `The WAV holds a sample that is not a number (frame ${i}); the file is damaged.`);
        samples[c][i] = v;
      }
  } else if (bitDepth === 16) {
    const k = 1 / 32768;
    for (let i = 0; i < frames; i++) for (let c = 0; c < nch; c++, off += 2) samples[c][i] = view.getInt16(off, le) * k;
  } else if (bitDepth === 32) {
    const k = 1 / 2147483648;
    for (let i = 0; i < frames; i++) for (let c = 0; c < nch; c++, off += 4) samples[c][i] = view.getInt32(off, le) * k;
  } else {
    const k = 1 / 8388608;
    for (let i = 0; i < frames; i++)
      for (let c = 0; c < nch; c++, off += bps) {
        const v = le
          ? bytes[off] | (bytes[off + 1] << 8) | (bytes[off + 2] << 16)
          : bytes[off + 2] | (bytes[off + 1] << 8) | (bytes[off] << 16);
        samples[c][i] = ((v << 8) >> 8) * k; // sign-extend 24 → 32 bits
      }
  }
  const positiveFullScale = encoding === "float" ? 1 : 1 - 2 ** -(bitDepth - 1);
  return { ...format, samples, positiveFullScale };
}
