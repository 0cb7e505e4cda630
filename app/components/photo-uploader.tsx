import { useEffect, useId, useLayoutEffect, useRef, useState, type DragEvent } from "react";
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
  type ArrangeBody,
} from "~/photos/client";
import { Button } from "./Button";
import { PhotoTile, PHOTO_DRAG_TYPE } from "./photo-tile";
import { UploadRow, useUploadQueue } from "./photo-upload-queue";
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
  /** The heading above the drop zone; null when the page already titles this part. */
  title?: string | null;
  className?: string;
}

const POLL_MS = 1500;

export function PhotoUploader({ listingId, initialPhotos, onChange, title = "Photos", className }: PhotoUploaderProps) {
  const queryClient = useQueryClient();
  const queryKey = photosQueryKey(listingId);
  const inputId = useId();
  const hintId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const gridRef = useRef<HTMLOListElement>(null);
  // Where keyboard focus goes once the list shows a change: a photo's control at its new place.
  const pendingFocus = useRef<{ photoId: string; action: string; index: number } | "chooser" | null>(null);
  const [announcement, setAnnouncement] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [dropping, setDropping] = useState(false);

  const query = useQuery({
    queryKey,
    queryFn: () => fetchPhotos(listingId),
    initialData: initialPhotos ? { photos: initialPhotos, maxPhotos: PHOTO_LIMITS.maxPhotos, maxBytes: PHOTO_LIMITS.maxBytes } : undefined,
    staleTime: 0,
    refetchInterval: (q) => (q.state.data?.photos.some((p) => p.status === "processing") ? POLL_MS : false),
  });
  const list = query.data;
  const photos = list?.photos ?? [];
  const maxPhotos = list?.maxPhotos ?? PHOTO_LIMITS.maxPhotos;
  const maxBytes = list?.maxBytes ?? PHOTO_LIMITS.maxBytes;

  const queue = useUploadQueue({
    listingId,
    shownIds: photos.map((p) => p.id),
    onSent: () => void queryClient.invalidateQueries({ queryKey }),
    onRefused: (file, failure) => {
      setAnnouncement(`${file.name} was not accepted: ${failure.message}`);
      if (failure.code === "too_many_photos") void queryClient.invalidateQueries({ queryKey });
    },
    onCancelled: (file) => setAnnouncement(`Upload of ${file.name} cancelled.`),
  });
  const uploads = queue.items;

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
      pendingFocus.current = next ? { photoId: next.id, action: "delete", index: Math.min(index, data.photos.length - 1) } : "chooser";
      setAnnouncement(`Photo ${index + 1} deleted.`);
    },
  });

  const slotsLeft = maxPhotos - photos.length - queue.pending;

  function addFiles(files: File[]) {
    if (files.length === 0) return;
    const plan = planSelection(files, slotsLeft, { maxPhotos, maxBytes });
    queue.add(files, plan);
    const sending = plan.filter((p) => p.send).length;
    setAnnouncement(
      `${sending} photo${sending === 1 ? "" : "s"} uploading` +
        (sending < files.length ? `; ${files.length - sending} not sent (see the list).` : "."),
    );
  }

  function move(photoId: string, to: number, action: string) {
    const from = photos.findIndex((p) => p.id === photoId);
    if (from < 0 || to < 0 || to >= photos.length || from === to) return;
    pendingFocus.current = { photoId, action, index: to };
    arrange.mutate({
      order: moveId(
        photos.map((p) => p.id),
        from,
        to,
      ),
    });
    setAnnouncement(`Photo ${from + 1} moved to position ${to + 1}.`);
  }

  const dropFiles = (e: DragEvent) => {
    setDropping(false);
    if (e.dataTransfer.types.includes(PHOTO_DRAG_TYPE)) return;
    e.preventDefault();
    addFiles([...e.dataTransfer.files]);
  };

  return (
    <section
      className={cx("space-y-5", className)}
      aria-labelledby={title ? `${inputId}-title` : undefined}
      aria-label={title ? undefined : "Photos"}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        {title ? (
          <h2 id={`${inputId}-title`} className="text-xl">
            {title}
          </h2>
        ) : null}
        <p className="figures ml-auto text-sm text-ink-soft">
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
          JPEG or PNG, up to {formatBytes(maxBytes)} each, {maxPhotos} per listing. Location and camera details are removed from every
          photo. The first photo is the cover unless you pick another.
        </p>
      </div>

      {uploads.length > 0 ? (
        <ul aria-label="Uploads" className="space-y-2">
          {uploads.map((u) => (
            <UploadRow key={u.key} item={u} onCancel={() => queue.cancel(u.key)} onDismiss={() => queue.dismiss(u.key)} />
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
