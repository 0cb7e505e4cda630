import { useCallback, useEffect, useRef, useState } from "react";
import { useFetcher } from "react-router";
import type { FieldErrors } from "@shared/listing-draft";

// Saves a step as the seller types: a short pause after the last change, then one PATCH to the owner's
// listing API through a fetcher (so the page's data refreshes afterwards). The step reads its own form
// first with the shared schema; input that does not read is not sent, and its messages show at once.

export type SaveStatus = "idle" | "waiting" | "saving" | "saved" | "invalid" | "failed";
export type SaveState = { status: SaveStatus; message?: string; savedAt?: Date };
export type Build = () => { ok: true; body: Record<string, unknown> } | { ok: false; errors: FieldErrors };

type ApiIssue = { path: string; message: string };
type ApiAnswer = {
  error?: string;
  message?: string;
  issues?: ApiIssue[];
  sheetChanged?: boolean;
  wasVerified?: boolean;
  listing?: { benchVerified: boolean; status: string };
};

export function useAutosave(listingId: string, { delay = 900, onSaved }: { delay?: number; onSaved?: (answer: ApiAnswer) => void } = {}) {
  const fetcher = useFetcher<ApiAnswer>();
  const [state, setState] = useState<SaveState>({ status: "idle" });
  const [clientErrors, setClientErrors] = useState<FieldErrors>({});
  const [serverIssues, setServerIssues] = useState<ApiIssue[]>([]);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const build = useRef<Build | null>(null);
  const action = `/api/v1/listings/${listingId}`;

  const send = useCallback(() => {
    timer.current = null;
    const b = build.current;
    if (!b) return;
    const r = b();
    if (!r.ok) {
      setClientErrors(r.errors);
      const n = Object.keys(r.errors).length;
      setState({ status: "invalid", message: `Not saved: ${n} field${n > 1 ? "s need" : " needs"} attention.` });
      return;
    }
    setClientErrors({});
    build.current = null;
    setState({ status: "saving" });
    // The answer arrives as fetcher.data (the effect below); a failed request shows there too.
    void fetcher.submit(r.body as never, { method: "PATCH", action, encType: "application/json" });
  }, [fetcher, action]);

  /** Call on every change; `b` reads the form when the pause is over. */
  const schedule = useCallback(
    (b: Build) => {
      build.current = b;
      setState((s) => (s.status === "saving" ? s : { status: "waiting" }));
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(send, delay);
    },
    [send, delay],
  );

  // One save at a time: a change made while saving is sent when the answer is in.
  useEffect(() => {
    if (fetcher.state !== "idle" || !fetcher.data) return;
    const answer = fetcher.data;
    if (answer.error) {
      setServerIssues(answer.issues ?? []);
      setState({ status: "failed", message: answer.message ?? "Could not save; try the Save button." });
    } else {
      setServerIssues([]);
      setState({ status: "saved", savedAt: new Date() });
      onSaved?.(answer);
    }
    if (build.current && !timer.current) timer.current = setTimeout(send, 50);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- once per answer: onSaved is a new function on every render
  }, [fetcher.state, fetcher.data]);

  // Leaving the step with a change still waiting: send it anyway (keepalive survives the navigation).
  useEffect(
    () => () => {
      if (!timer.current || !build.current) return;
      clearTimeout(timer.current);
      const r = build.current();
      if (r.ok)
        void fetch(action, {
          method: "PATCH",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify(r.body),
          keepalive: true,
        });
    },
    [action],
  );

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (timer.current || fetcher.state !== "idle") e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [fetcher.state]);

  return { state, schedule, clientErrors, serverIssues, saving: fetcher.state !== "idle" };
}

/** The save state in a few words, for a live region beside the Save button. */
export function describeSave(s: SaveState): string {
  switch (s.status) {
    case "waiting":
      return "Unsaved changes…";
    case "saving":
      return "Saving…";
    case "saved":
      return `Saved at ${s.savedAt?.toLocaleTimeString("en-GB", { hour: "2-digit", minute: "2-digit", second: "2-digit" })}`;
    case "invalid":
    case "failed":
      return s.message ?? "Not saved.";
    default:
      return "Changes save as you type.";
  }
}
