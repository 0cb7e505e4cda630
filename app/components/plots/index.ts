// Loadline's own plots: SVG drawn on the server, readable without script, each with its words for
// screen readers. See scale.ts for the axes' arithmetic.
export { FrequencyResponsePlot, ResponseTable, Legend, describeResponses, type ResponseSeries } from "./FrequencyResponsePlot";
export { HarmonicSpectrumPlot, describeHarmonics, type Harmonic } from "./HarmonicSpectrumPlot";
export { TracePlot, describeTrace } from "./TracePlot";
export { ImpedancePlot, describeImpedance, type ImpedancePoint } from "./ImpedancePlot";
