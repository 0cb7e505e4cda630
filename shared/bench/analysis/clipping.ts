// A capture that sat at digital full scale for a run of samples was clipped by the analyser:
// its harmonics are the converter's, not the unit's.

export const CLIP_RUN_SAMPLES = 4;

export interface ClippedRun {
  /** Sample index where the run starts. */
  index: number;
  length: number;
}

/**
 * First run of at least `minRun` consecutive samples at or beyond full scale.
 * `positiveLimit` is the largest code as a fraction of full scale (e.g. 32767/32768 for 16-bit PCM);
 * the negative limit is −1.
 */
export function findClippedRun(samples: Float64Array, positiveLimit: number, minRun = CLIP_RUN_SAMPLES): ClippedRun | null {
  let run = 0;
  for (let i = 0; i < samples.length; i++) {
    const v = samples[i];
    if (v >= positiveLimit || v <= -1) {
      run++;
      if (run >= minRun) {
        const start = i - run + 1;
        let end = i + 1;
        while (end < samples.length && (samples[end] >= positiveLimit || samples[end] <= -1)) end++;
        return { index: start, length: end - start };
      }
    } else {
      run = 0;
    }
  }
  return null;
}
