import { describe, expect, it } from "vitest";
import {
  analyseCapture,
  CAPTURE_LIMITS,
  CaptureError,
  checkHeader,
  HEADER_BYTES,
  identifyCapture,
  identifyCaptureFile,
  inferKind,
} from "~/bench/captures.server";
import type { CaptureConditions, SineCaptureConditions } from "@shared/bench/analysis";
import {
  aLawWav,
  longSilentWav,
  mp3Bytes,
  mp3FrameOnly,
  toneSamples,
  toneWav,
  wavFromSamples,
  wavWithFormatCode,
  prng,
} from "../support/capture-files";

// Every bad file a seller might upload is refused with a code and a sentence that names the problem.

const sine: SineCaptureConditions = {
  kind: "sine",
  scale: { kind: "volts-per-full-scale", volts: 1, basis: "peak" },
  weighting: "unweighted",
  window: "blackman-harris-7",
};
const enc = (s: string) => new TextEncoder().encode(s);

function refusal(run: () => unknown): CaptureError {
  try {
    run();
  } catch (e) {
    if (e instanceof CaptureError) return e;
    throw e;
  }
  throw new Error("expected the file to be refused");
}

async function refusalOf(run: Promise<unknown>): Promise<CaptureError> {
  try {
    await run;
  } catch (e) {
    if (e instanceof CaptureError) return e;
    throw e;
  }
  throw new Error("expected the file to be refused");
}

/**
 * The analysis job refuses the file; where its first bytes already tell, the upload's header check
 * (run while the file streams to storage) refuses it the same way.
 */
function refused(bytes: Uint8Array, name: string, c: CaptureConditions = sine): CaptureError {
  const job = refusal(() => analyseCapture(bytes, name, c, "cap"));
  try {
    checkHeader(bytes.subarray(0, HEADER_BYTES), name, c);
  } catch (e) {
    if (!(e instanceof CaptureError)) throw e;
    expect(e.code).toBe(job.code);
    expect(e.message).toBe(job.message);
  }
  return job;
}

const headerRefusal = (bytes: Uint8Array, name: string, c: CaptureConditions = sine) =>
  refusal(() => checkHeader(bytes.subarray(0, HEADER_BYTES), name, c));

const goodWav = () => toneWav({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5, bits: "24", channels: 2 });

describe("the upload's header check (the web process reads only the first bytes)", () => {
  it("refuses what the first bytes rule out: not a WAV, a compressed or 8-bit WAV, the wrong kind", () => {
    expect(headerRefusal(enc("frequency,level\n1000,0\n"), "capture.wav").code).toBe("not_wav");
    expect(headerRefusal(mp3Bytes(), "take1.wav").code).toBe("not_wav");
    expect(headerRefusal(wavWithFormatCode(0x55), "capture.wav").code).toBe("unsupported_format");
    expect(headerRefusal(goodWav(), "c.wav", { kind: "sweep", reference: "flat", iecPole: false }).code).toBe("kind_mismatch");
  });

  it("leaves to the job what needs the whole file: clipping, length, silence", () => {
    const clipped = toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, peak: 1.5, bits: "16", channels: 1 });
    expect(() => checkHeader(clipped.subarray(0, HEADER_BYTES), "hot.wav", sine)).not.toThrow();
    expect(refusal(() => analyseCapture(clipped, "hot.wav", sine, "cap")).code).toBe("clipped");
    expect(() => checkHeader(longSilentWav(61).subarray(0, HEADER_BYTES), "long.wav", sine)).not.toThrow();
  });
});

describe("WAV files that cannot be measured", () => {
  it("a text file named .wav", () => {
    const e = refused(enc("frequency,level\n1000,0\n"), "capture.wav");
    expect(e.code).toBe("not_wav");
    expect(e.status).toBe(422);
    expect(e.message).toBe('"capture.wav" is named as a WAV but holds text, not audio.');
  });

  it("an MP3 file named .wav (ID3 tag), and a bare MPEG stream, named by file-type's signatures as the upload arrives", async () => {
    expect(refused(mp3Bytes(), "take1.wav").code).toBe("not_wav");
    const e = await refusalOf(identifyCaptureFile(mp3Bytes(), "take1.wav"));
    expect(e.code).toBe("not_wav");
    expect(e.message).toBe('"take1.wav" is named as a WAV but is an MP3 audio file.');
    expect((await refusalOf(identifyCaptureFile(mp3FrameOnly(), "take2.wav"))).message).toMatch(
      /is an (MP3 audio file|MPEG audio stream)\.$/,
    );
  });

  it("an MP3 stream inside a WAV container (format code 0x55)", () => {
    const e = refused(wavWithFormatCode(0x55), "capture.wav");
    expect(e.code).toBe("unsupported_format");
    expect(e.message).toBe("The WAV holds MP3 (compressed) audio; upload uncompressed PCM (16, 24 or 32-bit) or 32-bit float.");
  });

  it("A-law compressed WAV", () => {
    const e = refused(aLawWav(), "capture.wav");
    expect(e.code).toBe("unsupported_format");
    expect(e.message).toContain("A-law (compressed)");
  });

  it("8-bit PCM", () => {
    const bytes = wavFromSamples([toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5 })], 48_000, "8");
    const e = refused(bytes, "capture.wav");
    expect(e.code).toBe("unsupported_format");
    expect(e.message).toBe("The WAV is 8-bit PCM (too coarse to measure distortion); upload 16, 24 or 32-bit PCM, or 32-bit float.");
  });

  it("a sample rate below 44.1 kHz, and three channels", () => {
    const x = toneSamples({ sampleRate: 22_050, seconds: 0.5, f0: 1000, peak: 0.5 });
    expect(refused(wavFromSamples([x], 22_050, "16"), "c.wav").message).toBe(
      "The WAV is sampled at 22050 Hz; captures must be sampled between 44.1 and 192 kHz.",
    );
    const y = toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5 });
    expect(refused(wavFromSamples([y, y, y], 48_000, "16"), "c.wav").message).toBe("The WAV has 3 channels; upload mono or stereo.");
  });

  it("a clipped capture: the right channel sits at full scale", () => {
    const left = toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5 });
    const right = left.map((v) => Math.max(-1, Math.min(1, v * 2.6)));
    const e = refused(wavFromSamples([left, right], 48_000, "16"), "hot.wav");
    expect(e.code).toBe("clipped");
    expect(e.message).toMatch(
      /^The right channel sits at digital full scale for \d+ samples from \d+\.\d ms: the analyser input was overloaded\. Add attenuation and capture again\.$/,
    );
  });

  it("a float capture that runs past ±1.0 is clipped too", () => {
    const x = toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 1.3 });
    expect(refused(wavFromSamples([x], 48_000, "32f"), "f.wav").code).toBe("clipped");
  });

  it("a sine that only touches full scale for a sample or two is not clipped", () => {
    // A peak right at full scale lands on the top code at most for a couple of samples at 1 kHz.
    const x = toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 1 - 2 ** -16 });
    expect(() => analyseCapture(wavFromSamples([x], 48_000, "16"), "c.wav", sine, "cap")).not.toThrow();
  });

  it("too short for the resolution asked", () => {
    const bytes = toneWav({ sampleRate: 48_000, seconds: 0.05, f0: 1000, peak: 0.5, bits: "16", channels: 1 });
    const e = refused(bytes, "short.wav");
    expect(e.code).toBe("too_short");
    expect(e.message).toBe("The capture holds 0.050 s (2400 samples at 48000 Hz); a 5 Hz resolution needs at least 0.200 s.");
    const fine = refusal(() => analyseCapture(goodWav(), "c.wav", { ...sine, resolutionHz: 1 }, "cap"));
    expect(fine.message).toBe("The capture holds 0.500 s (24000 samples at 48000 Hz); a 1 Hz resolution needs at least 1.000 s.");
  });

  it("too short to separate the harmonics of a low tone", () => {
    const bytes = toneWav({ sampleRate: 48_000, seconds: 0.5, f0: 20, peak: 0.5, bits: "24", channels: 1 });
    const e = refusal(() => analyseCapture(bytes, "low.wav", sine, "cap"));
    expect(e.code).toBe("too_short");
    expect(e.message).toMatch(
      /^The capture is too short to separate the harmonics of a 20\.0 Hz tone: it needs at least 1\.\d\d s, it holds 0\.50 s\.$/,
    );
  });

  it("silence: no fundamental", () => {
    const bytes = wavFromSamples([new Float64Array(48_000)], 48_000, "32f");
    const e = refused(bytes, "silence.wav");
    expect(e.code).toBe("no_fundamental");
    expect(e.message).toBe("No fundamental found: the mono channel is silent.");
  });

  it("a stereo file with one channel empty is analysed on the other; both empty is silence", () => {
    const x = toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5 });
    const r = analyseCapture(wavFromSamples([new Float64Array(x.length), x], 48_000, "24"), "one-side.wav", sine, "cap");
    if (r.kind !== "sine") throw new Error("expected a sine analysis");
    expect(r.analysis.channels.map((c) => c.channel)).toEqual(["right"]);
    // The left side holds only the converter's dither: named as skipped, with the reason.
    expect(r.analysis.skipped).toEqual([
      { channel: "left", error: "no_fundamental", message: expect.stringContaining("does not stand 30 dB clear") },
    ]);
    const quiet = wavFromSamples([new Float64Array(24_000), new Float64Array(24_000)], 48_000, "32f");
    expect(refused(quiet, "quiet.wav").message).toBe("No fundamental found: both channels are silent.");
  });

  it("noise without a tone: no fundamental (found only by the analysis)", () => {
    const r = prng(3);
    const noise = Float64Array.from({ length: 48_000 }, () => (r() - 0.5) * 0.01);
    const bytes = wavFromSamples([noise], 48_000, "24");
    const e = refusal(() => analyseCapture(bytes, "hiss.wav", sine, "cap"));
    expect(e.code).toBe("no_fundamental");
    expect(e.message).toMatch(
      /^No fundamental found between 20 and 20000 Hz: the strongest component \(.+ Hz, .+ dBFS\) does not stand 30 dB clear of the noise\.$/,
    );
  });

  it("a tone far from the stated fundamental", () => {
    const e = refusal(() => analyseCapture(goodWav(), "c.wav", { ...sine, fundamentalHz: 5000 }, "cap"));
    expect(e.code).toBe("no_fundamental");
    expect(e.message).toContain("within ±10 % of the stated 5000 Hz");
  });

  it("longer than 60 s", () => {
    const bytes = longSilentWav(61);
    const e = refused(bytes, "long.wav");
    expect(e.code).toBe("too_long");
    expect(e.message).toBe(`The capture lasts 61.0 s; captures are limited to ${CAPTURE_LIMITS.maxSeconds} s.`);
  });

  it("over 50 MB, refused before it is read", () => {
    const bytes = new Uint8Array(CAPTURE_LIMITS.maxBytes + 1);
    const e = refusal(() => identifyCapture(bytes, "huge.wav"));
    expect(e.code).toBe("file_too_large");
    expect(e.status).toBe(413);
    expect(e.message).toBe("The file is 50.0 MB; captures are limited to 50.0 MB.");
  });

  it("an empty file, and a file that is neither WAV nor CSV", async () => {
    expect(refusal(() => identifyCapture(new Uint8Array(0), "x.wav")).code).toBe("empty_file");
    const e = await refusalOf(identifyCaptureFile(mp3Bytes(), "take.mp3"));
    expect(e.code).toBe("unsupported_format");
    expect(e.message).toBe("The file is an MP3 audio file; upload a WAV (PCM or float) or a CSV.");
  });

  it("a WAV sent with sweep conditions", () => {
    const e = refused(goodWav(), "c.wav", { kind: "sweep", reference: "flat", iecPole: false });
    expect(e.code).toBe("kind_mismatch");
    expect(e.message).toBe("The conditions describe a frequency sweep (CSV frequency,level), but the file is a WAV.");
  });

  it("a WAV whose data chunk runs past the end of the file (recorder stopped) is read as far as it goes", () => {
    const bytes = goodWav();
    const cut = bytes.subarray(0, bytes.length - 6000);
    const r = analyseCapture(cut, "cut.wav", sine, "cap");
    expect(r.format.file === "wav" && r.format.frames).toBe(24_000 - 1000);
  });
});

describe("CSV files that cannot be measured", () => {
  const square: CaptureConditions = { kind: "square" };
  const sweep: CaptureConditions = { kind: "sweep", reference: "flat", iecPole: false };

  it("a header without the needed columns", () => {
    const e = refused(enc("time,current\n0,1\n"), "scope.csv", square);
    expect(e.code).toBe("csv_columns_missing");
    expect(e.message).toBe("The CSV header (line 1: time, current) has no 'volts' column; expected columns 'time' and 'volts'.");
  });

  it("a row with one column", () => {
    const e = refused(enc("frequency,level\n20,-0.1\n1000\n"), "sweep.csv", sweep);
    expect(e.code).toBe("csv_columns_missing");
    expect(e.message).toBe("Line 3 has 1 column; expected columns 'frequency' and 'level'.");
  });

  it("a cell that is not a number", () => {
    const e = refused(enc("frequency,level\n20,-0.1\n1000,abc\n20000,-0.2\n"), "sweep.csv", sweep);
    expect(e.code).toBe("csv_not_number");
    expect(e.message).toBe("Line 3, column 'level': 'abc' is not a number.");
  });

  it("too few rows", () => {
    const e = refused(enc("frequency,level\n1000,0\n"), "sweep.csv", sweep);
    expect(e.code).toBe("csv_too_few_rows");
    expect(e.message).toBe("The CSV file has 1 data row; at least 3 are needed.");
  });

  it("an empty CSV", () => {
    expect(refused(enc("\n\n"), "sweep.csv", sweep).code).toBe("csv_columns_missing");
  });

  it("time that does not rise from row to row", () => {
    const rows = ["time,volts", ...Array.from({ length: 12 }, (_, i) => `${i === 6 ? 0.001 : i * 1e-6},${i < 6 ? 0 : 1}`)];
    const e = refusal(() => analyseCapture(enc(rows.join("\n")), "scope.csv", square, "cap"));
    expect(e.code).toBe("csv_not_increasing");
  });

  it("a flat trace has no edge", () => {
    const rows = ["time,volts", ...Array.from({ length: 20 }, (_, i) => `${i * 1e-6},0.5`)];
    const e = refusal(() => analyseCapture(enc(rows.join("\n")), "scope.csv", square, "cap"));
    expect(e.code).toBe("square_no_edge");
    expect(e.message).toBe("The trace is flat: no edge to measure.");
  });

  it("a sweep that misses 1 kHz", () => {
    const e = refusal(() => analyseCapture(enc("frequency,level\n2000,0\n5000,-1\n10000,-2\n"), "sweep.csv", sweep, "cap"));
    expect(e.code).toBe("sweep_invalid");
    expect(e.message).toBe("The sweep runs from 2000 Hz to 10000 Hz; it must include 1 kHz, the reference frequency.");
  });
});

describe("telling captures apart", () => {
  it("by content, and the kind from the CSV header", () => {
    expect(identifyCapture(goodWav(), "whatever.bin")).toBe("wav");
    expect(identifyCapture(enc("time,volts\n0,0\n"), "scope.txt")).toBe("csv");
    expect(inferKind(goodWav(), "wav")).toBe("sine");
    expect(inferKind(enc("Time (s);Voltage (V)\n0;0\n"), "csv")).toBe("square");
    expect(inferKind(enc("# exported\nFrequency (Hz),Level (dB)\n"), "csv")).toBe("sweep");
    expect(inferKind(enc("0,1\n1,2\n"), "csv")).toBeNull();
  });

  it("reads a semicolon CSV with decimal commas and units in the header", () => {
    const csv = "Frequency (Hz);Level (V)\n100;0,98\n1000;1,00\n10000;0,5\n";
    const r = analyseCapture(enc(csv), "sweep.csv", { kind: "sweep", reference: "flat", iecPole: false }, "cap");
    if (r.kind !== "sweep") throw new Error("expected a sweep");
    expect(r.analysis.conditions.levelUnit).toBe("V");
    expect(r.analysis.levelAt1kHz).toEqual({ value: 1, unit: "V" });
    expect(r.analysis.worstDeviation.deviation.value).toBeCloseTo(20 * Math.log10(0.5), 9);
  });
});
