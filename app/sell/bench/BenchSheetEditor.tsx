import { useEffect, useMemo, useRef, useState } from "react";
import { Form } from "react-router";
import { Button } from "~/components/Button";
import { CheckboxField, Field, FormError, TextareaField } from "~/components/Field";
import { checkBenchSheet, CATEGORY_QUANTITIES, type Outcome, type Verdict } from "@shared/bench";
import { foldCapture, type CaptureResult } from "@shared/bench-form/capture-fold";
import { AMPLIFIER_CATEGORIES } from "@shared/bench/quantities";
import { blankRow, type SheetRow } from "@shared/bench-form/rows";
import { readSheetState, type SheetFormState } from "@shared/bench-form/state";
import { SaveBar } from "../SaveBar";
import { Section } from "../Section";
import { useAutosave } from "../useAutosave";
import { BenchCautions } from "./BenchCautions";
import { CAPTURE_ADD_FORM_ID, CAPTURE_FORM_ID, CapturePanel } from "./CapturePanel";
import type { CaptureFormState } from "./capture-kinds";
import { CaptureGroup, type CaptureItem } from "./CaptureGroup";
import { ReadingRow } from "./ReadingRow";
import { OutcomeCounts, VerdictPanel } from "./VerdictPanel";

const RANK: Record<Outcome, number> = { implausible: 3, questionable: 2, missing: 1, consistent: 0 };

function useHydrated() {
  const [on, setOn] = useState(false);
  useEffect(() => setOn(true), []);
  return on;
}

/** Keeps one empty row in each group, so there is always somewhere to type (also without JavaScript). */
function withSpareRows(state: SheetFormState): SheetFormState {
  const rows = [...state.rows];
  for (const basis of ["measured", "rated"] as const)
    if (!rows.some((r) => r.basis === basis && !r.capture && !r.value.trim() && !r.quantity))
      rows.push(blankRow(`new-${basis}-${rows.length}`, basis));
  return rows.length === state.rows.length ? state : { ...state, rows };
}

export function BenchSheetEditor({
  listingId,
  initial,
  published,
  serverErrors,
  formError,
  busy,
  notice,
  capture,
}: {
  notice?: string;
  /** The plain-form capture path's outcome (see CapturePanel). */
  capture?: CaptureFormState;
  listingId: string;
  initial: SheetFormState;
  published: boolean;
  serverErrors?: string[];
  formError?: string;
  busy: boolean;
}) {
  const hydrated = useHydrated();
  const captureSubmit = useRef<((form: HTMLFormElement) => void) | null>(null);
  const [state, setState] = useState(() => withSpareRows(initial));
  const read = useMemo(() => readSheetState(state), [state]);
  const fresh = useMemo<Verdict | null>(() => (read.sheet ? checkBenchSheet(read.sheet) : null), [read.sheet]);
  const lastGood = useRef<Verdict | null>(fresh);
  if (fresh) lastGood.current = fresh;
  const verdict = fresh ?? lastGood.current;
  // What the last save did to a published listing's standing, in words.
  const [standing, setStanding] = useState<string | null>(null);
  const autosave = useAutosave(listingId, {
    onSaved: (a) => {
      if (!a.sheetChanged) return;
      if (a.listing?.status === "held")
        setStanding("The saved sheet has an implausible outcome: the listing is now held for the review desk.");
      else if (a.wasVerified && !a.listing?.benchVerified)
        setStanding("The changed sheet no longer earns the bench-verified mark; the mark is off the listing until the sheet passes again.");
      else if (a.listing?.benchVerified) setStanding(a.wasVerified ? null : "Checked again: the listing carries the bench-verified mark.");
      else setStanding(null);
    },
  });
  const latest = useRef(read);
  latest.current = read;
  // Only the seller's own edits save; opening the page (or React re-running effects) does not.
  const dirty = useRef(false);

  useEffect(() => {
    if (!dirty.current) return;
    autosave.schedule(() => {
      const r = latest.current;
      if (r.sheet) return { ok: true, body: { benchSheet: r.sheet } };
      return {
        ok: false,
        errors: Object.fromEntries(Object.entries(r.rowErrors).flatMap(([k, e]) => Object.entries(e).map(([f, m]) => [`${k}.${f}`, m]))),
      };
    });
    // eslint-disable-next-line react-hooks/exhaustive-deps -- once per edit: autosave is a new object on every render
  }, [state]);

  const set = (next: (s: SheetFormState) => SheetFormState) => {
    dirty.current = true;
    setState((s) => withSpareRows(next(s)));
  };
  const patchRow = (key: string, patch: Partial<SheetRow>) =>
    set((s) => ({ ...s, rows: s.rows.map((r) => (r.key === key ? { ...r, ...patch } : r)) }));
  const removeRow = (key: string) => set((s) => ({ ...s, rows: s.rows.filter((r) => r.key !== key) }));
  const addRow = (basis: SheetRow["basis"]) => set((s) => ({ ...s, rows: [...s.rows, blankRow(`add-${Date.now()}`, basis)] }));
  const removeCapture = (id: string | undefined) =>
    set((s) => ({ ...s, rows: s.rows.filter((r) => !r.capture || r.capture.captureId !== id) }));
  const setMeta = (patch: Partial<SheetFormState["meta"]>) => set((s) => ({ ...s, meta: { ...s.meta, ...patch } }));
  const foldIn = (c: CaptureResult) => set((s) => foldCapture(s, c));

  // Labels M1…, R1… in each group, and the worst outcome of any rule that compared a row.
  const labels = new Map<string, string>();
  let m = 0;
  let rr = 0;
  for (const row of state.rows) labels.set(row.key, row.basis === "rated" ? `R${++rr}` : `M${++m}`);
  const worst = new Map<string, Outcome>();
  for (const r of verdict?.results ?? [])
    for (const ref of r.refs) {
      const key = read.refToRow[ref];
      if (key && RANK[r.outcome] > RANK[worst.get(key) ?? "consistent"]) worst.set(key, r.outcome);
    }
  const rowLabel = (ref: string) => {
    if (ref.startsWith("sweeps.")) return `sweep ${Number(ref.split(".")[1]) + 1}`;
    const key = read.refToRow[ref];
    return key ? (labels.get(key) ?? null) : null;
  };
  const quantities = CATEGORY_QUANTITIES[state.category];
  const amp = AMPLIFIER_CATEGORIES.includes(state.category);
  const saveErrors = [...(serverErrors ?? []), ...autosave.serverIssues.map((i) => `${i.path.replace(/^benchSheet\./, "")}: ${i.message}`)];

  // Typed rows one by one; the readings of one capture together.
  const group = (basis: SheetRow["basis"]) => {
    const out: React.ReactNode[] = [];
    let captured: CaptureItem[] = [];
    const flush = () => {
      if (!captured.length) return;
      const id = captured[0].row.capture!.captureId;
      out.push(<CaptureGroup key={`capture-${id}-${captured[0].row.key}`} items={captured} onRemove={() => removeCapture(id)} />);
      captured = [];
    };
    state.rows.forEach((row, index) => {
      if (row.basis !== basis) return;
      if (row.capture) {
        if (captured.length && captured[0].row.capture!.captureId !== row.capture.captureId) flush();
        captured.push({ row, index, label: labels.get(row.key)!, outcome: worst.get(row.key) });
        return;
      }
      flush();
      out.push(
        <ReadingRow
          key={row.key}
          row={row}
          index={index}
          label={labels.get(row.key)!}
          quantities={quantities}
          result={read.rows[row.key]}
          outcome={worst.get(row.key)}
          onChange={(p) => patchRow(row.key, p)}
          onRemove={() => removeRow(row.key)}
        />,
      );
    });
    flush();
    return <ol className="space-y-3">{out}</ol>;
  };

  return (
    <div className="space-y-5">
      <BenchCautions />
      <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <Form method="post" className="min-w-0 space-y-5" noValidate aria-label="Bench sheet">
          <input type="hidden" name="rows" value={state.rows.length} />
          <input type="hidden" name="sweeps" value={JSON.stringify(state.sweeps)} />
          {state.equipment ? <input type="hidden" name="equipment" value={JSON.stringify(state.equipment)} /> : null}
          <FormError>{formError}</FormError>
          {saveErrors.length ? (
            <div role="alert" className="rounded-md border border-fault/40 bg-fault-wash px-3 py-2 text-sm text-fault">
              <p className="font-medium">The server did not save the sheet:</p>
              <ul className="list-disc pl-5">
                {saveErrors.map((e, i) => (
                  <li key={i}>{e}</li>
                ))}
              </ul>
            </div>
          ) : null}
          {verdict ? (
            <div className="flex flex-wrap items-center gap-2 rounded-md border border-rule bg-card px-3 py-2 lg:hidden" aria-hidden="true">
              <span className="text-sm font-medium">Live check:</span>
              <OutcomeCounts verdict={verdict} />
            </div>
          ) : null}

          <Section
            title="Measured on this unit"
            lede="Type each value with its unit as your instrument shows it (112 W, 28.3 Vrms, 80 Vpp, 0.03 %, −80 dB, 17 µs) and the conditions it was taken in. Leave a row's value empty to skip it."
          >
            {group("measured")}
            {hydrated ? (
              <Button variant="quiet" size="sm" onClick={() => addRow("measured")}>
                Add a measured reading
              </Button>
            ) : null}
          </Section>

          <Section
            id="captures"
            title="Captures"
            lede="Upload the raw file behind a figure: a WAV of the output sine into the dummy load, a square-wave or sweep CSV, or a WAV of the 3150 Hz test tone played from a test record or tape. The bench analyses it and its figures join the sheet, marked as from a capture."
          >
            <CapturePanel
              onCapture={foldIn}
              category={state.category}
              listingId={listingId}
              hydrated={hydrated}
              submitRef={captureSubmit}
              form={capture}
            />
            {state.sweeps.length ? (
              <ul className="space-y-1 text-sm">
                {state.sweeps.map((s, i) => (
                  <li
                    key={s.captureId ?? i}
                    className="flex items-center justify-between gap-2 rounded-md border border-trace/30 bg-trace-wash/50 px-3 py-2"
                  >
                    <span>
                      {s.kind === "riaa" ? "RIAA response sweep" : "Response sweep"}, {s.points.length} points
                      {s.channel ? `, ${s.channel}` : ""} — from a capture
                    </span>
                    {hydrated ? (
                      <Button
                        variant="quiet"
                        size="sm"
                        onClick={() => set((st) => ({ ...st, sweeps: st.sweeps.filter((_, n) => n !== i) }))}
                      >
                        Remove
                      </Button>
                    ) : null}
                  </li>
                ))}
              </ul>
            ) : null}
          </Section>

          <Section
            title="The maker's ratings"
            lede="Figures from the manual or spec sheet, kept apart from what you measured. The bench compares the two."
          >
            {group("rated")}
            {hydrated ? (
              <Button variant="quiet" size="sm" onClick={() => addRow("rated")}>
                Add a rating
              </Button>
            ) : null}
          </Section>

          <Section title="About the measurement">
            <div className="grid gap-4 sm:grid-cols-2">
              <Field
                label="Measured on"
                name="measuredOn"
                type="date"
                value={state.meta.measuredOn}
                onChange={(e) => setMeta({ measuredOn: e.target.value })}
                optional
                error={read.metaErrors.measuredOn}
              />
              <Field
                label="Measured by"
                name="measuredBy"
                value={state.meta.measuredBy}
                onChange={(e) => setMeta({ measuredBy: e.target.value })}
                maxLength={120}
                optional
                error={read.metaErrors.measuredBy}
                hint="The technician or workshop."
              />
              {amp ? (
                <>
                  <Field
                    label="Channels"
                    name="channelCount"
                    inputMode="numeric"
                    value={state.meta.channelCount}
                    onChange={(e) => setMeta({ channelCount: e.target.value })}
                    optional
                    error={read.metaErrors.channelCount}
                    hint="2 unless it is a mono block."
                  />
                  <CheckboxField
                    label="Bridged (BTL) output"
                    name="bridged"
                    checked={state.meta.bridged}
                    onChange={(e) => setMeta({ bridged: e.target.checked })}
                    className="sm:pt-7"
                  />
                </>
              ) : null}
              <TextareaField
                label="Notes"
                name="notes"
                rows={3}
                value={state.meta.notes}
                onChange={(e) => setMeta({ notes: e.target.value })}
                optional
                error={read.metaErrors.notes}
                className="sm:col-span-2"
                hint="Equipment used, mains voltage during the test, anything a buyer re-measuring should know."
              />
            </div>
          </Section>
          <SaveBar state={autosave.state} busy={busy} notice={notice} next={{ label: "Save and review", short: "Review" }} />
        </Form>
        {/* The capture inputs belong to this form (form attribute), so they never post with the sheet.
            Without JavaScript it posts itself (multipart) to this step; with it, the panel uploads. */}
        <form
          id={CAPTURE_FORM_ID}
          hidden
          noValidate
          method="post"
          encType="multipart/form-data"
          action={`/sell/${listingId}/bench`}
          onSubmit={(e) => {
            e.preventDefault();
            captureSubmit.current?.(e.currentTarget);
          }}
        />
        <form id={CAPTURE_ADD_FORM_ID} hidden method="post" action={`/sell/${listingId}/bench`}>
          <input type="hidden" name="intent" value="add-capture" />
          <input type="hidden" name="captureId" value={capture?.posted?.id ?? ""} />
        </form>
        <aside className="space-y-3 lg:sticky lg:top-4">
          {standing ? (
            <p role="status" className="rounded-md border border-brass/50 bg-brass-wash px-3 py-2 text-sm text-brass-ink">
              {standing}
            </p>
          ) : null}
          <VerdictPanel verdict={verdict} stale={fresh ? 0 : read.errorCount} published={published} rowLabel={rowLabel} />
          <p className="text-xs text-ink-faint">
            The outcomes update as you type. The server checks the sheet again when it is saved and when you publish; its verdict is the one
            that counts.
          </p>
        </aside>
      </div>
    </div>
  );
}
