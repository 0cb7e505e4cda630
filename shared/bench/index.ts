// Public API of the bench: units, schema, rules, verdict, key figures. Isomorphic (browser and server).
export * from "./units";
export * from "./quantities";
export * from "./schema";
export * from "./describe";
export { checkBenchSheet, indexSheet, BENCH_RULES_VERSION, OUTCOMES, type Verdict, type CaptureFigure } from "./verdict";
export { verdictSchema } from "./verdict-schema";
export type { DerivedValue, Figure, Hazard, Outcome, RuleResult, Shortfall, SkippedRule } from "./rules/types";
export { RULES, RULE_IDS, type Rule } from "./rules";
export { REQUIRED_READINGS, type Requirement } from "./rules/required";
export { riaaDeviation, bestRiaaFit, levelAt, type RiaaFit } from "./rules/phono";
export { keyFigures, sheetFilterFacets, KEY_FIGURES, type KeyFigure, type FigureKey, type SheetFacets } from "./figures";
export { checkBenchSheetJson, type CheckResponse } from "./api";
export { exampleIntegratedAmplifierSheet, doctoredIntegratedAmplifierSheet, exampleIntegratedAmplifierRequest } from "./examples";
export { lowerLabel, categoryNoun, withArticle } from "./words";
