// Types for the second, general-purpose FFT package the reference tests compare against.
declare module "fft-js" {
  export function fft(signal: number[]): [number, number][];
  export const util: { fftMag(phasors: [number, number][]): number[] };
  export function dft(signal: number[]): [number, number][];
}
