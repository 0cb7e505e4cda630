// Capture analysis: pure functions on sample arrays, shared by the server job and the browser.
export * from "./errors";
export * from "./types";
export * from "./windows";
export { powerSpectrum, bareFft, nextPowerOfTwo, MAX_FFT_SIZE, type PowerSpectrum } from "./spectrum";
export * from "./sine";
export * from "./square";
export * from "./sweep";
export * from "./csv";
export * from "./clipping";
export { aWeightingPowerTable } from "./weighting";
export * from "./conditions";
export * from "./to-readings";
export * from "./stored";
export * from "./impedance";
export * from "./impedance-readings";
