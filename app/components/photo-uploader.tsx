import { useCallback, useEffect, useId, useLayoutEffect, useRef, useState, type DragEvent } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { PHOTO_LIMITS, formatBytes, type PhotoListView, type PhotoView } from "~/photos/limits";
import {
  applyArrange,
  arrangePhotos,
  deletePhoto,
  fetchPhotos,
  moveId,
  photosQueryKey,
  planSelection,
  sendPhoto,
  type ArrangeBody,
} from "~/photos/client";
import { Button } from "./Button";
import { PhotoTile, PHOTO_DRAG_TYPE } from "./photo-tile";
import { cx } from "./cx";

// The photo part of the seller's listing editor: choose or drop up to 24 JPEG/PNG files at once;
// each uploads on its own request with its own progress bar and answer; then each photo shows its
// state (processing → ready) by polling, and can be moved, made the cover or deleted.

export interface PhotoUploaderProps {
  listingId: string;
  /** The listing's photos as the page loader read them, shown before the first fetch. */
  initialPhotos?: PhotoView[];
  /** Told whenever the server's list of photos changes. */
  onChange?: (photos: PhotoView[]) => void;
  className?: string;
}

type UploadState = "waiting" | "uploading" | "sent" | "refused";
interface UploadItem {
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
const POLL_MS = 1500;

export function PhotoUploader({ listingId, initialPhotos, onChange, className }: PhotoUploaderProps) {
  const queryClient = useQueryClient();
  const queryKey = photosQueryKey(listingId);
  const inputId = useId();
  const hintId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const gridRef = useRef<HTMLOListElement>(null);
  const aborts = useRef(new Map<string, () => void>());
  const started = useRef(new Set<string>());
  const nextKey = useRef(0);
  // Where keyboard focus goes once the list shows a change: a photo's control at its new place.
  const pendingFocus = useRef<{ photoId: string; action: string; index: number } | "chooser" | null>(null);
  const [uploads, setUploads] = useState<UploadItem[]>([]);
  const [announcement, setAnnouncement] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [dropping, setDropping] = useState(false);

  const query = useQuery({
    queryKey,
    queryFn: () => fetchPhotos(listingId),
    initialData: initialPhotos
      ? { photos: initialPhotos, maxPhotos: PHOTO_LIMITS.maxPhotos, maxBytes: PHOTO_LIMITS.maxBytes }
      : undefined,
    staleTime: 0,
    refetchInterval: (q) => (q.state.data?.photos.some((p) => p.status === "processing") ? POLL_MS : false),
  });
  const list = query.data;
  const photos = list?.photos ?? [];
  const maxPhotos = list?.maxPhotos ?? PHOTO_LIMITS.maxPhotos;
  const maxBytes = list?.maxBytes ?? PHOTO_LIMITS.maxBytes;

  const update = useCallback((key: string, change: Partial<UploadItem>) => {
    setUploads((all) => all.map((u) => (u.key === key ? { ...u, ...change } : u)));
  }, []);

  // Start waiting files, a few at a time.
  useEffect(() => {
    const active = uploads.filter((u) => u.state === "uploading").length;
    const ready = uploads.filter((u) => u.state === "waiting" && !started.current.has(u.key));
    for (const item of ready.slice(0, Math.max(0, PARALLEL - active))) {
      started.current.add(item.key);
      update(item.key, { state: "uploading" });
      const handle = sendPhoto(listingId, item.file, (loaded, total) => update(item.key, { loaded, total }));
      aborts.current.set(item.key, handle.abort);
      void handle.done.then((result) => {
        aborts.current.delete(item.key);
        if (result.ok) {
          update(item.key, { state: "sent", loaded: item.file.size, total: item.file.size, photoId: result.photo.id });
          void queryClient.invalidateQueries({ queryKey });
        } else if (result.aborted) {
          setUploads((all) => all.filter((u) => u.key !== item.key));
          setAnnouncement(`Upload of ${item.file.name} cancelled.`);
        } else {
          update(item.key, { state: "refused", message: result.failure.message });
          setAnnouncement(`${item.file.name} was not accepted: ${result.failure.message}`);
          if (result.failure.code === "too_many_photos") void queryClient.invalidateQueries({ queryKey });
        }
      });
    }
  }, [uploads, listingId, queryClient, queryKey, update]);

  // A sent file's row gives way to its photo once the list shows it.
  useEffect(() => {
    const shown = new Set(photos.map((p) => p.id));
    if (uploads.some((u) => u.state === "sent" && u.photoId && shown.has(u.photoId))) {
      setUploads((all) => all.filter((u) => !(u.state === "sent" && u.photoId && shown.has(u.photoId))));
    }
  }, [photos, uploads]);

  // Stop uploads when the editor goes away.
  useEffect(() => () => aborts.current.forEach((abort) => abort()), []);

  // Say when photos finish, and pass the list on.
  const lastStatus = useRef(new Map<string, PhotoView["status"]>());
  useEffect(() => {
    const done: string[] = [];
    photos.forEach((p, i) => {
      const before = lastStatus.current.get(p.id);
      if (before === "processing" && p.status === "ready") done.push(`Photo ${i + 1} is ready.`);
      if (before === "processing" && p.status === "failed") done.push(`Photo ${i + 1} could not be processed: ${p.error}`);
    });
    lastStatus.current = new Map(photos.map((p) => [p.id, p.status]));
    if (done.length) setAnnouncement(done.join(" "));
    onChange?.(photos);
  }, [list]); // eslint-disable-line react-hooks/exhaustive-deps -- once per new list

  // Keep keyboard focus on the control that was used, wherever its photo moved to (moving a node
  // in the document drops its focus, so it is put back once the list shows the new order).
  useLayoutEffect(() => {
    const target = pendingFocus.current;
    if (!target) return;
    if (target === "chooser") {
      pendingFocus.current = null;
      inputRef.current?.focus();
      return;
    }
    if (photos[target.index]?.id !== target.photoId) return;
    pendingFocus.current = null;
    const tile = gridRef.current?.querySelector(`[data-photo-id="${target.photoId}"]`);
    const enabled = [...(tile?.querySelectorAll<HTMLButtonElement>("button") ?? [])].filter((b) => !b.disabled);
    (enabled.find((b) => b.dataset.action === target.action) ?? enabled[0])?.focus();
  });

  // One after another, in the order the seller made them; the buttons stay usable (and focused)
  // while a change is on its way.
  const arrange = useMutation({
    scope: { id: `listing-photos-${listingId}` },
    mutationFn: (body: ArrangeBody) => arrangePhotos(listingId, body),
    onMutate: async (body) => {
      setProblem(null);
      await queryClient.cancelQueries({ queryKey });
      const before = queryClient.getQueryData<PhotoListView>(queryKey);
      if (before) queryClient.setQueryData(queryKey, applyArrange(before, body));
      return { before };
    },
    onError: (error, _body, context) => {
      pendingFocus.current = null;
      if (context?.before) queryClient.setQueryData(queryKey, context.before);
      setProblem(error.message);
      void queryClient.invalidateQueries({ queryKey });
    },
    onSuccess: (data) => queryClient.setQueryData(queryKey, data),
  });

  const remove = useMutation({
    mutationFn: (photoId: string) => deletePhoto(listingId, photoId),
    onMutate: () => setProblem(null),
    onError: (error) => setProblem(error.message),
    onSuccess: (data, photoId) => {
      const index = photos.findIndex((p) => p.id === photoId);
      queryClient.setQueryData(queryKey, data);
      const next = data.photos[Math.min(index, data.photos.length - 1)];
      pendingFocus.current = next
        ? { photoId: next.id, action: "delete", index: Math.min(index, data.photos.length - 1) }
        : "chooser";
      setAnnouncement(`Photo ${index + 1} deleted.`);
    },
  });

  const inFlight = uploads.filter((u) => u.state !== "refused").length;
  const slotsLeft = maxPhotos - photos.length - inFlight;

  function addFiles(files: File[]) {
    if (files.length === 0) return;
    const plan = planSelection(files, slotsLeft, { maxPhotos, maxBytes });
    const items: UploadItem[] = files.map((file, i) => {
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
    setUploads((all) => [...all, ...items]);
    const sending = items.filter((i) => i.state === "waiting").length;
    setAnnouncement(
      `${sending} photo${sending === 1 ? "" : "s"} uploading` +
        (sending < items.length ? `; ${items.length - sending} not sent (see the list).` : "."),
    );
  }

  function move(photoId: string, to: number, action: string) {
    const from = photos.findIndex((p) => p.id === photoId);
    if (from < 0 || to < 0 || to >= photos.length || from === to) return;
    pendingFocus.current = { photoId, action, index: to };
    arrange.mutate({ order: moveId(photos.map((p) => p.id), from, to) });
    setAnnouncement(`Photo ${from + 1} moved to position ${to + 1}.`);
  }

  const dropFiles = (e: DragEvent) => {
    setDropping(false);
    if (e.dataTransfer.types.includes(PHOTO_DRAG_TYPE)) return;
    e.preventDefault();
    addFiles([...e.dataTransfer.files]);
  };

  return (
    <section className={cx("space-y-5", className)} aria-labelledby={`${inputId}-title`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`${inputId}-title`} className="text-xl">
          Photos
        </h2>
        <p className="figures text-sm text-ink-soft">
          {photos.length} of {maxPhotos}
        </p>
      </div>

      <div
        onDragOver={(e) => {
          if (e.dataTransfer.types.includes(PHOTO_DRAG_TYPE)) return;
          e.preventDefault();
          setDropping(true);
        }}
        onDragLeave={() => setDropping(false)}
        onDrop={dropFiles}
        className={cx(
          "flex flex-col items-center gap-3 rounded-panel border-2 border-dashed px-4 py-6 text-center transition-colors",
          dropping ? "border-walnut bg-walnut-wash" : "border-rule-strong bg-card",
        )}
      >
        <p className="text-[0.9375rem] text-ink">Drop photos here, or</p>
        <input
          ref={inputRef}
          id={inputId}
          type="file"
          multiple
          accept="image/jpeg,image/png,.jpg,.jpeg,.png"
          aria-describedby={hintId}
          className="sr-only"
          disabled={slotsLeft <= 0}
          onChange={(e) => {
            addFiles([...(e.currentTarget.files ?? [])]);
            e.currentTarget.value = "";
          }}
        />
        <Button variant="secondary" disabled={slotsLeft <= 0} onClick={() => inputRef.current?.click()} aria-describedby={hintId}>
          Choose photos
        </Button>
        <p id={hintId} className="text-[0.8125rem] text-ink-faint">
          JPEG or PNG, up to {formatBytes(maxBytes)} each, {maxPhotos} per listing. Location and camera details are
          removed from every photo. The first photo is the cover unless you pick another.
        </p>
      </div>

      {uploads.length > 0 ? (
        <ul aria-label="Uploads" className="space-y-2">
          {uploads.map((u) => (
            <UploadRow
              key={u.key}
              item={u}
              onCancel={() => {
                const abort = aborts.current.get(u.key);
                if (abort) abort();
                else setUploads((all) => all.filter((x) => x.key !== u.key)); // not started yet
              }}
              onDismiss={() => setUploads((all) => all.filter((x) => x.key !== u.key))}
            />
          ))}
        </ul>
      ) : null}

      {problem ? (
        <p role="alert" className="rounded-md border border-fault/35 bg-fault-wash px-3 py-2 text-sm text-fault">
          {problem}
        </p>
      ) : null}
      {query.isError && !list ? (
        <p role="alert" className="rounded-md border border-fault/35 bg-fault-wash px-3 py-2 text-sm text-fault">
          {query.error.message}
        </p>
      ) : null}

      {photos.length > 0 ? (
        <ol ref={gridRef} aria-label="Photos, in listing order" className="grid grid-cols-2 items-start gap-3 sm:grid-cols-3">
          {photos.map((photo, index) => (
            <PhotoTile
              key={photo.id}
              photo={photo}
              index={index}
              count={photos.length}
              deleting={remove.isPending && remove.variables === photo.id}
              onMove={(to) => move(photo.id, to, to < index ? "earlier" : "later")}
              onCover={() => {
                pendingFocus.current = { photoId: photo.id, action: "cover", index };
                arrange.mutate({ coverId: photo.id });
                setAnnouncement(`Photo ${index + 1} is now the cover.`);
              }}
              onDelete={() => remove.mutate(photo.id)}
              onDropPhoto={(draggedId) => move(draggedId, index, "earlier")}
            />
          ))}
        </ol>
      ) : list && uploads.length === 0 ? (
        <p className="text-sm text-ink-soft">No photos yet. Buyers look at the front, the back panel and the inside first.</p>
      ) : null}

      <p aria-live="polite" className="sr-only">
        {announcement}
      </p>
    </section>
  );
}

function UploadRow({ item, onCancel, onDismiss }: { item: UploadItem; onCancel: () => void; onDismiss: () => void }) {
  const percent = item.total > 0 ? Math.round((item.loaded / item.total) * 100) : 0;
  const refused = item.state === "refused";
  return (
    <li
      className={cx(
        "rounded-md border px-3 py-2",
        refused ? "border-fault/35 bg-fault-wash" : "border-rule bg-card",
      )}
    >
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
