// POST /api/v1/bench-sheets/check as a plain function: raw body text in, status and JSON body out.
import { parseBenchSheet, type SheetIssue } from "./schema";
import { checkBenchSheet, type Verdict } from "./verdict";

/** A sheet with 300 readings and a few long sweeps stays well under this. */
export const MAX_BODY_BYTES = 512 * 1024;

export type CheckResponse =
  | { status: 200; body: Verdict }
  | { status: 400; body: { error: "invalid_json"; message: string } }
  | { status: 400; body: { error: "invalid_sheet"; message: string; issues: SheetIssue[] } }
  | { status: 413; body: { error: "too_large"; message: string } };

export function checkBenchSheetJson(text: string): CheckResponse {
  if (text.length > MAX_BODY_BYTES)
    return { status: 413, body: { error: "too_large", message: `A bench sheet may be at most ${MAX_BODY_BYTES / 1024} KB of JSON.` } };
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    return {
      status: 400,
      body: { error: "invalid_json", message: `The body is not valid JSON: ${e instanceof Error ? e.message : String(e)}` },
    };
  }
  return checkBenchSheetData(data);
}

/** The check on a body already parsed from JSON (the server reads it through its body reader). */
export function checkBenchSheetData(data: unknown): Exclude<CheckResponse, { status: 413 } | { body: { error: "invalid_json" } }> {
  const parsed = parseBenchSheet(data);
  if (!parsed.ok)
    return {
      status: 400,
      body: { error: "invalid_sheet", message: "The bench sheet does not fit the schema; see issues.", issues: parsed.issues },
    };
  return { status: 200, body: checkBenchSheet(parsed.sheet) };
}
