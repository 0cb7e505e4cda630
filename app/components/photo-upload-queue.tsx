import { useCallback, useEffect, useRef, useState } from "react";
import { formatBytes } from "~/photos/limits";
import { sendPhoto, type PhotoApiFailure } from "~/photos/client";
import { Button } from "./Button";
import { cx } from "./cx";

// The files a seller has chosen, each on its own request with its own progress bar, and each
// answer kept beside its file.

type UploadState = "waiting" | "uploading" | "sent" | "refused";
export interface UploadItem {
  key: string;
  file: File;
  state: UploadState;
  loaded: number;
  total: number;
  message?: string;
  photoId?: string;
}

/**
 * Files on the wire at once. One: the uplink is the limit anyway, and photos then arrive (and take
 * their places) in the order the seller chose them. The rest wait, each with its own bar.
 */
const PARALLEL = 1;

export function useUploadQueue(opts: {
  listingId: string;
  /** Photo ids the list shows: a sent file's row gives way to its photo. */
  shownIds: string[];
  onSent: (photoId: string) => void;
  onRefused: (file: File, failure: PhotoApiFailure) => void;
  onCancelled: (file: File) => void;
}) {
  const { listingId, shownIds } = opts;
  const [items, setItems] = useState<UploadItem[]>([]);
  const aborts = useRef(new Map<string, () => void>());
  const started = useRef(new Set<string>());
  const nextKey = useRef(0);
  const callbacks = useRef(opts);
  callbacks.current = opts;

  const update = useCallback((key: string, change: Partial<UploadItem>) => {
    setItems((all) => all.map((u) => (u.key === key ? { ...u, ...change } : u)));
  }, []);
  const drop = useCallback((key: string) => setItems((all) => all.filter((u) => u.key !== key)), []);

  useEffect(() => {
    const active = items.filter((u) => u.state === "uploading").length;
    const waiting = items.filter((u) => u.state === "waiting" && !started.current.has(u.key));
    for (const item of waiting.slice(0, Math.max(0, PARALLEL - active))) {
      started.current.add(item.key);
      update(item.key, { state: "uploading" });
      const handle = sendPhoto(listingId, item.file, (loaded, total) => update(item.key, { loaded, total }));
      aborts.current.set(item.key, handle.abort);
      void handle.done.then((result) => {
        aborts.current.delete(item.key);
        if (result.ok) {
          update(item.key, { state: "sent", loaded: item.file.size, total: item.file.size, photoId: result.photo.id });
          callbacks.current.onSent(result.photo.id);
        } else if (result.aborted) {
          drop(item.key);
          callbacks.current.onCancelled(item.file);
        } else {
          update(item.key, { state: "refused", message: result.failure.message });
          callbacks.current.onRefused(item.file, result.failure);
        }
      });
    }
  }, [items, listingId, update, drop]);

  const shownKey = shownIds.join(",");
  useEffect(() => {
    const shown = new Set(shownKey.split(","));
    setItems((all) => {
      const rest = all.filter((u) => !(u.state === "sent" && u.photoId && shown.has(u.photoId)));
      return rest.length === all.length ? all : rest;
    });
  }, [shownKey]);

  // Stop uploads when the editor goes away.
  useEffect(() => {
    const running = aborts.current;
    return () => running.forEach((abort) => abort());
  }, []);

  return {
    items,
    /** Files not yet refused: waiting, on the wire, or sent and not yet in the list. */
    pending: items.filter((u) => u.state !== "refused").length,
    add(files: File[], plan: Array<{ send: true } | { send: false; message: string }>) {
      const added: UploadItem[] = files.map((file, i) => {
        const step = plan[i];
        return {
          key: `u${nextKey.current++}`,
          file,
          state: step.send ? "waiting" : "refused",
          loaded: 0,
          total: file.size,
          message: step.send ? undefined : step.message,
        };
      });
      setItems((all) => [...all, ...added]);
    },
    cancel(key: string) {
      const abort = aborts.current.get(key);
      if (abort) abort();
      else drop(key); // not started yet
    },
    dismiss: drop,
  };
}

export function UploadRow({ item, onCancel, onDismiss }: { item: UploadItem; onCancel: () => void; onDismiss: () => void }) {
  const percent = item.total > 0 ? Math.round((item.loaded / item.total) * 100) : 0;
  const refused = item.state === "refused";
  return (
    <li className={cx("rounded-md border px-3 py-2", refused ? "border-fault/35 bg-fault-wash" : "border-rule bg-card")}>
      <div className="flex items-center justify-between gap-3">
        <p className="min-w-0 truncate text-sm font-medium text-ink" title={item.file.name}>
          {item.file.name}
          <span className="figures ml-2 font-normal text-ink-faint">{formatBytes(item.file.size)}</span>
        </p>
        {item.state === "uploading" || item.state === "waiting" ? (
          <Button variant="quiet" size="sm" onClick={onCancel} aria-label={`Cancel upload of ${item.file.name}`}>
            Cancel
          </Button>
        ) : refused ? (
          <Button variant="quiet" size="sm" onClick={onDismiss} aria-label={`Dismiss ${item.file.name}`}>
            Dismiss
          </Button>
        ) : null}
      </div>
      {refused ? (
        <p className="mt-1 text-sm text-fault">{item.message}</p>
      ) : (
        <div className="mt-1.5 flex items-center gap-3">
          <progress
            className={cx(
              "h-2 w-full appearance-none overflow-hidden rounded-full bg-sunk",
              "[&::-webkit-progress-bar]:bg-sunk [&::-webkit-progress-value]:bg-walnut [&::-moz-progress-bar]:bg-walnut",
              item.state === "sent" && "[&::-webkit-progress-value]:bg-trace [&::-moz-progress-bar]:bg-trace",
            )}
            max={100}
            value={percent}
            aria-label={`Uploading ${item.file.name}`}
          />
          <span className="figures w-24 shrink-0 text-right text-xs text-ink-soft">
            {item.state === "waiting" ? "waiting" : item.state === "sent" ? "processing" : `${percent} %`}
          </span>
        </div>
      )}
    </li>
  );
}
