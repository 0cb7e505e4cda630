import { useEffect, useId, useRef, useState } from "react";
import { Button } from "~/components/Button";
import { Badge } from "~/components/Badge";
import { z } from "zod";
import { describeReading, readingSchema, sweepSchema } from "@shared/bench";
import type { CaptureResult } from "@shared/bench-form/capture-fold";
import { isOneOf } from "@shared/one-of";
import { Field, KindFields, WowFlutterFields, inputClass, selectClass } from "./CaptureKindFields";
import type { Category } from "@shared/bench/quantities";

import { CAPTURE_FORM_ID, CAPTURE_KINDS, type CaptureFormState, type CaptureKind } from "./capture-kinds";
import { PostedCapture } from "./PostedCapture";

// Raw measurement files (WAV, CSV) sent to the capture API with the conditions they were taken in; the
// analysis comes back as readings that the sheet takes over, marked as from a capture. Without
// JavaScript the same fields post as a plain multipart form to the bench step, which runs the same
// capture logic and shows the outcome here after the redirect (`form`).

type Item = {
  key: number;
  fileName: string;
  state: "uploading" | "analysing" | "done" | "failed";
  progress: number;
  message?: string;
  result?: CaptureResult;
  /** Where to queue it again, when it failed on our side rather than for what the file holds. */
  retry?: string;
};

/** What the capture API answers, read loosely: on an error most fields are missing. */
const AnswerSchema = z
  .object({
    id: z.string(),
    fileName: z.string(),
    status: z.string(),
    poll: z.string(),
    readings: z.array(readingSchema),
    sweep: sweepSchema,
    message: z.string(),
    retry: z.string(),
    error: z.union([z.string(), z.object({ message: z.string().nullable() })]),
  })
  .partial();
type Answer = { status: number; body: z.infer<typeof AnswerSchema> };

function readAnswer(status: number, body: unknown): Answer {
  const parsed = AnswerSchema.safeParse(body ?? {});
  return parsed.success
    ? { status, body: parsed.data }
    : { status: status === 200 ? 502 : status, body: { message: "The server's answer could not be read." } };
}

function upload(form: FormData, listingId: string | undefined, onProgress: (p: number) => void): Promise<Answer> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    // Uploaded for this listing: deleting the draft removes the capture even if it never reaches the sheet.
    xhr.open("POST", `/api/v1/captures/analyze?wait=8${listingId ? `&listing=${encodeURIComponent(listingId)}` : ""}`);
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => resolve(readAnswer(xhr.status, xhr.response));
    xhr.onerror = () => resolve({ status: 0, body: { message: "The connection dropped; check it and try again." } });
    xhr.send(form);
  });
}

async function poll(url: string): Promise<Answer> {
  for (let i = 0; i < 90; i++) {
    await new Promise((r) => setTimeout(r, 1000));
    const res = await fetch(url, { headers: { Accept: "application/json" } });
    const answer = readAnswer(res.status, await res.json().catch(() => null));
    if (!res.ok) return answer;
    if (answer.body.status === "done" || answer.body.status === "failed") return answer;
  }
  return { status: 504, body: { message: "The analysis is taking unusually long; reload the page later." } };
}

export { CAPTURE_ADD_FORM_ID, CAPTURE_FORM_ID } from "./capture-kinds";

/** Turntables and tape decks are measured from a test tone; everything else starts from a sine. */
const firstKind = (category?: Category): CaptureKind => (category === "turntable" || category === "tape_deck" ? "wow_flutter" : "sine");

export function CapturePanel({
  onCapture,
  category,
  listingId,
  hydrated = true,
  submitRef,
  form,
}: {
  onCapture: (c: CaptureResult) => void;
  category?: Category;
  listingId?: string;
  hydrated?: boolean;
  /** Set to the upload, for the capture form's submit event (JavaScript on). */
  submitRef?: React.RefObject<((form: HTMLFormElement) => void) | null>;
  form?: CaptureFormState;
}) {
  const fileId = useId();
  const [kind, setKind] = useState<CaptureKind>(form?.kind ?? firstKind(category));
  const [items, setItems] = useState<Item[]>([]);
  const lastKey = useRef(0);
  const [problem, setProblem] = useState<string | null>(null);
  const update = (key: number, patch: Partial<Item>) => setItems((all) => all.map((i) => (i.key === key ? { ...i, ...patch } : i)));

  async function analyse(form: HTMLFormElement) {
    const data = new FormData(form);
    const file = data.get("file");
    if (!(file instanceof File) || !file.name) return setProblem("Choose a WAV or CSV file first.");
    setProblem(null);
    // Blank optional fields are left out so the API applies its defaults.
    for (const [k, v] of [...data.entries()]) if (typeof v === "string" && !v.trim()) data.delete(k);
    const key = ++lastKey.current;
    setItems((all) => [{ key, fileName: file.name, state: "uploading", progress: 0 }, ...all]);
    let answer = await upload(data, listingId, (p) => update(key, { progress: p }));
    if (answer.status === 202 && answer.body.poll) {
      update(key, { state: "analysing", progress: 1 });
      answer = await poll(answer.body.poll);
    }
    if (finish(key, file.name, answer)) {
      form.reset();
      setKind(firstKind(category));
    }
  }

  useEffect(() => {
    if (submitRef) submitRef.current = (f) => void analyse(f);
  });

  /** Show the answer on the item; true when the capture's readings went to the sheet. */
  function finish(key: number, fileName: string, answer: Answer): boolean {
    const b = answer.body;
    if (answer.status === 200 && b.status === "done" && b.id) {
      const result: CaptureResult = {
        id: b.id,
        fileName: b.fileName ?? fileName,
        readings: b.readings ?? [],
        ...(b.sweep ? { sweep: b.sweep } : {}),
      };
      update(key, { state: "done", progress: 1, result, message: undefined, retry: undefined });
      onCapture(result);
      return true;
    }
    const message = (typeof b.error === "object" ? b.error.message : null) ?? b.message ?? `The server answered ${answer.status}.`;
    update(key, { state: "failed", message, retry: b.retry });
    return false;
  }

  /** Queue a capture that failed on our side again, then wait for it as for an upload. */
  async function tryAgain(item: Item) {
    if (!item.retry) return;
    update(item.key, { state: "analysing", message: undefined, retry: undefined });
    const res = await fetch(item.retry, { method: "POST", headers: { Accept: "application/json" } });
    let answer = readAnswer(res.status, await res.json().catch(() => null));
    if (answer.status === 202 && answer.body.poll) answer = await poll(answer.body.poll);
    finish(item.key, item.fileName, answer);
  }

  return (
    <div className="space-y-4">
      <div className="space-y-3" role="group" aria-label="Add a capture">
        <div className="grid gap-3 sm:grid-cols-2">
          <label className="block space-y-1 sm:col-span-2" htmlFor={fileId}>
            <span className="text-sm font-medium">Capture file (WAV or CSV)</span>
            <input
              form={CAPTURE_FORM_ID}
              id={fileId}
              name="file"
              type="file"
              accept=".wav,.csv,audio/wav,audio/x-wav,text/csv"
              className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-card file:px-3 file:py-1.5 file:text-sm file:font-medium"
            />
          </label>
          <Field label="What it holds">
            <select
              form={CAPTURE_FORM_ID}
              name="kind"
              value={kind}
              onChange={(e) => setKind(isOneOf(CAPTURE_KINDS, e.target.value) ? e.target.value : "sine")}
              className={selectClass}
            >
              <option value="sine">Sine at the output (distortion, level, noise)</option>
              <option value="square">Square wave (rise time)</option>
              <option value="sweep">Frequency sweep (response)</option>
              <option value="impedance">Impedance sweep (loudspeaker)</option>
              <option value="separation">One channel driven (separation)</option>
              <option value="imd">Two tones (intermodulation)</option>
              <option value="output_impedance">Tone open, then loaded (output impedance)</option>
              <option value="wow_flutter">Test tone from a test record or tape (wow & flutter, speed)</option>
            </select>
          </Field>
          {kind === "wow_flutter" ? (
            <WowFlutterFields category={category} />
          ) : (
            <Field label="Load">
              <input
                form={CAPTURE_FORM_ID}
                name="loadOhm"
                inputMode="decimal"
                placeholder="8"
                className={inputClass}
                aria-describedby={`${fileId}-ohm`}
              />
              <span id={`${fileId}-ohm`} className="text-xs text-ink-faint">
                Ω, the dummy load the output drove
              </span>
            </Field>
          )}
          <Field label="Channel (for a mono file)">
            <select form={CAPTURE_FORM_ID} name="channel" className={selectClass} defaultValue="">
              <option value="">Stereo file: left, right</option>
              <option value="left">Left</option>
              <option value="right">Right</option>
              <option value="mono">Mono unit</option>
            </select>
          </Field>
          <KindFields kind={kind} />
        </div>
        {problem ? (
          <p role="alert" className="text-sm font-medium text-fault">
            {problem}
          </p>
        ) : null}
        {form?.failure ? (
          <div role="alert" className="space-y-1 text-sm font-medium text-fault">
            <p>{form.failure.message}</p>
            {form.failure.issues.length > 1 ? (
              <ul className="list-disc pl-5 font-normal">
                {form.failure.issues.map((m, n) => (
                  <li key={n}>{m}</li>
                ))}
              </ul>
            ) : null}
          </div>
        ) : null}
        <div className="flex flex-wrap gap-2">
          {/* Without JavaScript the fields above are the kind's shown on loading: this asks for another kind's. */}
          {!hydrated && listingId ? (
            <Button variant="quiet" type="submit" form={CAPTURE_FORM_ID} formMethod="get" formAction={`/sell/${listingId}/bench#captures`}>
              Show the fields for this kind
            </Button>
          ) : null}
          <Button variant="secondary" type="submit" form={CAPTURE_FORM_ID}>
            Upload and analyse
          </Button>
        </div>
      </div>
      {form?.posted ? <PostedCapture posted={form.posted} listingId={listingId} /> : null}
      {items.length ? (
        <ul className="space-y-2" aria-label="Captures">
          {items.map((i) => (
            <li key={i.key} className="space-y-1.5 rounded-md border border-rule bg-card p-3 text-sm" data-capture-state={i.state}>
              <div className="flex flex-wrap items-center justify-between gap-2">
                <span className="truncate font-medium">{i.fileName}</span>
                <Badge tone={i.state === "done" ? "trace" : i.state === "failed" ? "fault" : "brass"}>
                  {i.state === "uploading"
                    ? "Uploading"
                    : i.state === "analysing"
                      ? "Analysing"
                      : i.state === "done"
                        ? "Analysed"
                        : i.retry
                          ? "Failed"
                          : "Refused"}
                </Badge>
              </div>
              {i.state === "uploading" || i.state === "analysing" ? (
                <progress
                  max={1}
                  value={i.state === "uploading" ? i.progress : undefined}
                  className="h-1.5 w-full accent-walnut"
                  aria-label={`${i.fileName}: ${i.state}`}
                />
              ) : null}
              {i.message ? (
                <p role="alert" className="text-fault">
                  {i.message}
                </p>
              ) : null}
              {i.retry ? (
                <Button variant="secondary" onClick={() => void tryAgain(i)}>
                  Try the analysis again
                </Button>
              ) : null}
              {i.result ? (
                <ul className="text-xs text-ink-soft">
                  {i.result.readings.map((r, n) => (
                    <li key={n}>{describeReading(r)}</li>
                  ))}
                  {i.result.sweep ? <li>Response sweep with {i.result.sweep.points.length} points</li> : null}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
