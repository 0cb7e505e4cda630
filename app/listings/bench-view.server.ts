import {
  QUANTITY_INFO,
  channelLabel,
  checkBenchSheet,
  describeConditions,
  formatReadingValue,
  keyFigures,
  type BenchSheet,
  type Outcome,
  type Verdict,
} from "@shared/bench";
import type { BenchSheet as BenchSheetRow } from "~/models/bench-sheet.server";
import type { Capture } from "~/models/capture.server";
import { captureNote } from "./captures.server";
import type { BenchView, CheckRow, KeyFigureView } from "./types";
import { dayText } from "@shared/dates";

// The bench sheet as the listing page shows it: rows built field by field from the parsed sheet, so
// nothing else stored in it (the equipment's serial number in particular) reaches the page.

/** The verdict the bench stored when it checked the sheet; checked afresh only if none (readable) was stored. */
function verdictFor(row: BenchSheetRow, sheet: BenchSheet): Verdict {
  return row.verdict ?? checkBenchSheet(sheet);
}

/** "2025-03-14" → "14 Mar 2025"; anything else as written. */
function measuredDay(iso: string): string {
  return /^\d{4}-\d{2}-\d{2}$/.test(iso) && !Number.isNaN(new Date(iso).getTime()) ? dayText(iso) : iso;
}

/** "65" + "W" from "65 W"; "±0.3" + "dB"; a bare number has no unit. */
function splitDisplay(display: string): { value: string; unit: string } {
  const i = display.indexOf(" ");
  const [value, unit] = i < 0 ? [display, ""] : [display.slice(0, i), display.slice(i + 1)];
  return { value: value.replace(/^-/, "−"), unit };
}

export function keyFigureViews(sheet: BenchSheet | null): KeyFigureView[] {
  if (!sheet) return [];
  return keyFigures(sheet).map((k) => {
    const { value, unit } = splitDisplay(k.display);
    const channel = k.channel && k.channel !== "both" && k.channel !== "mono" ? channelLabel(k.channel) : null;
    // The headline keeps the conditions that change the number; mains and warm-up are in the sheet below.
    const headline = k.conditions.replace(/, [\d.]+ V mains/, "").replace(/, after [\d.]+ min warm-up/, "");
    const conditions = [headline, channel ? `${channel} channel` : null].filter(Boolean).join(", ");
    return { key: k.key, label: k.label, value, unit, conditions: conditions || "conditions not given", fromCapture: k.fromCapture };
  });
}

// Problems first, so a buyer meets them before thirty consistent rows.
const SEVERITY: Record<Outcome, number> = { implausible: 0, questionable: 1, missing: 2, consistent: 3 };

function groupChecks(verdict: Verdict, captureRefs: Set<string>): CheckRow[] {
  const rows = new Map<string, CheckRow>();
  for (const r of verdict.results) {
    const finding = {
      outcome: r.outcome,
      detail: r.detail,
      compared: (r.compared ?? []).map((f) => ({ label: f.label, display: f.display })),
      usesCapture: (r.refs ?? []).some((ref) => captureRefs.has(ref)),
    };
    const row = rows.get(r.ruleId);
    if (!row) {
      rows.set(r.ruleId, {
        ruleId: r.ruleId,
        title: r.title,
        outcome: r.outcome,
        explanation: r.explanation,
        source: r.source,
        findings: [finding],
        usesCapture: finding.usesCapture,
      });
      continue;
    }
    row.findings.push(finding);
    row.usesCapture ||= finding.usesCapture;
    if (SEVERITY[r.outcome] < SEVERITY[row.outcome]) row.outcome = r.outcome;
  }
  return [...rows.values()]
    .map((row) => ({ ...row, findings: [...row.findings].sort((a, b) => SEVERITY[a.outcome] - SEVERITY[b.outcome]) }))
    .sort((a, b) => SEVERITY[a.outcome] - SEVERITY[b.outcome]);
}

export function benchView(row: BenchSheetRow, sheet: BenchSheet, captures: Map<string, Capture>): BenchView {
  const verdict = verdictFor(row, sheet);
  const captureRefs = new Set([
    ...sheet.readings.flatMap((r, i) => (r.origin === "capture" ? [`readings.${i}`] : [])),
    ...(sheet.sweeps ?? []).flatMap((s, i) => (s.origin === "capture" ? [`sweeps.${i}`] : [])),
  ]);
  return {
    measuredBy: sheet.measuredBy ?? null,
    measuredOn: sheet.measuredOn ? measuredDay(sheet.measuredOn) : null,
    notes: sheet.notes ?? null,
    checkedAt: row.checkedAt ? row.checkedAt.toISOString() : null,
    summary: verdict.summary,
    verified: verdict.benchVerified,
    counts: verdict.counts,
    readings: sheet.readings.map((r, i) => ({
      ref: `readings.${i}`,
      quantity: QUANTITY_INFO[r.quantity]?.label ?? r.quantity,
      channel: r.channel ? channelLabel(r.channel) : null,
      value: formatReadingValue(r).replace(/^-/, "−"),
      conditions: describeConditions(r.conditions),
      basis: r.basis,
      fromCapture: r.origin === "capture",
      captureNote: r.origin === "capture" ? captureNote(r.captureId ? captures.get(r.captureId) : undefined) : null,
      note: r.note ?? null,
    })),
    checks: groupChecks(verdict, captureRefs),
    skipped: (verdict.skipped ?? []).map((s) => ({ title: s.title, reason: s.reason })),
    shortfalls: (verdict.shortfalls ?? []).map((s) => s.detail),
    derived: (verdict.derived ?? []).map((d) => ({ label: d.label, display: d.display })),
    captureCount: captureRefs.size,
    hazards: (verdict.hazards ?? []).map((h) => ({ title: h.title, detail: h.detail })),
  };
}
