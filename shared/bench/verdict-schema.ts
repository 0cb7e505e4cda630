// A stored verdict read back (bench_sheets.verdict). Lenient where older verdicts may differ: unknown
// keys are dropped and lists a later rules version added default to empty.
import { z } from "zod";
import { CATEGORIES, QUANTITIES } from "./quantities";
import { OUTCOMES } from "./rules/types";
import type { Verdict } from "./verdict";

const outcome = z.enum(OUTCOMES);
const refs = z.array(z.string());

export const verdictSchema = z.object({
  category: z.enum(CATEGORIES),
  benchVerified: z.boolean(),
  summary: z.string(),
  counts: z.record(outcome, z.number()),
  results: z.array(
    z.object({
      ruleId: z.string(),
      title: z.string(),
      outcome,
      explanation: z.string(),
      source: z.string(),
      detail: z.string(),
      refs,
      compared: z.array(z.object({ label: z.string(), value: z.number(), unit: z.string(), display: z.string() })).default([]),
    }),
  ),
  skipped: z.array(z.object({ ruleId: z.string(), title: z.string(), reason: z.string() })).default([]),
  derived: z
    .array(z.object({ id: z.string(), label: z.string(), value: z.number(), unit: z.string(), display: z.string(), refs }))
    .default([]),
  shortfalls: z.array(z.object({ ruleId: z.string(), detail: z.string(), percent: z.number(), refs })).default([]),
  fromCaptures: z
    .array(
      z.object({
        ref: z.string(),
        quantity: z.enum([...QUANTITIES, "sweep"]),
        label: z.string(),
        display: z.string(),
        captureId: z.string().optional(),
      }),
    )
    .default([]),
  hazards: z.array(z.object({ ruleId: z.string(), title: z.string(), detail: z.string(), refs })).default([]),
  rulesVersion: z.number().default(0),
});

// Compile-time proof that the schema and the Verdict type describe the same thing.
const _reads: (v: z.infer<typeof verdictSchema>) => Verdict = (v) => v;
const _writes: (v: Verdict) => z.input<typeof verdictSchema> = (v) => v;
void _reads;
void _writes;
