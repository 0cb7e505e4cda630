import { useEffect, useRef, useState, type KeyboardEvent, type MouseEvent } from "react";
import { cx } from "~/components/cx";
import type { GalleryPhoto } from "../types";

// The cover and the other photos, with a zoom view. Works without script: thumbnails are links that
// reload the page on that photo, and "Zoom" opens the zoom-size image itself. With script the zoom
// opens in a modal dialog: ← and → step through the photos, Esc closes, "Actual size" (or a click on
// the photo) shows it pixel for pixel in a scrollable frame.

export function Gallery({ photos, initial = 0, title }: { photos: GalleryPhoto[]; initial?: number; title: string }) {
  const [index, setIndex] = useState(Math.min(Math.max(0, initial), Math.max(0, photos.length - 1)));
  const [zoomOpen, setZoomOpen] = useState(false);
  const zoomButton = useRef<HTMLAnchorElement>(null);
  const wasOpen = useRef(false);

  // Back to the Zoom link once the dialog is gone (while it is open, everything behind it is inert).
  useEffect(() => {
    if (wasOpen.current && !zoomOpen) zoomButton.current?.focus();
    wasOpen.current = zoomOpen;
  }, [zoomOpen]);

  if (photos.length === 0) {
    return (
      <div className="flex aspect-[4/3] items-center justify-center rounded-panel border border-rule bg-sunk text-sm text-ink-faint">
        No photos yet
      </div>
    );
  }
  const photo = photos[index];
  const open = (e: MouseEvent) => {
    e.preventDefault();
    setZoomOpen(true);
  };

  return (
    <div className="space-y-3">
      <div className="relative overflow-hidden rounded-panel border border-rule bg-sunk shadow-panel">
        {/* A click on the photo zooms too; keyboard users have the Zoom link (one tab stop, not two). */}
        <img
          src={photo.listingUrl}
          alt={photo.alt}
          width={photo.width}
          height={photo.height}
          onClick={open}
          className="aspect-[4/3] w-full cursor-zoom-in object-cover"
          fetchPriority={index === 0 ? "high" : undefined}
        />
        <a
          ref={zoomButton}
          href={photo.zoomUrl}
          onClick={open}
          className="absolute bottom-3 right-3 inline-flex h-9 items-center gap-1.5 rounded-md border border-rule-strong bg-card/95 px-3 text-sm font-medium text-ink no-underline shadow-panel backdrop-blur-sm hover:border-walnut hover:text-walnut-deep"
        >
          <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
            <circle cx="7" cy="7" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.6" />
            <path d="M10.4 10.4L14 14M7 5v4M5 7h4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          </svg>
          Zoom<span className="sr-only"> into photo {index + 1}</span>
        </a>
        {photos.length > 1 ? (
          <span className="figures absolute bottom-3 left-3 rounded bg-ink/70 px-2 py-0.5 text-xs text-card">
            {index + 1} / {photos.length}
          </span>
        ) : null}
      </div>

      {photos.length > 1 ? (
        <ul className="grid grid-cols-5 gap-2 sm:grid-cols-6" aria-label={`Photos of the ${title}`}>
          {photos.map((p, i) => (
            <li key={p.id}>
              <a
                href={`?photo=${i + 1}`}
                onClick={(e) => {
                  e.preventDefault();
                  setIndex(i);
                }}
                aria-current={i === index ? "true" : undefined}
                aria-label={`Show photo ${i + 1} of ${photos.length}`}
                className={cx(
                  "block overflow-hidden rounded-md border-2 bg-sunk",
                  i === index ? "border-walnut" : "border-transparent opacity-80 hover:opacity-100",
                )}
              >
                <img src={p.thumbUrl} alt="" loading="lazy" decoding="async" className="aspect-square w-full object-cover" />
              </a>
            </li>
          ))}
        </ul>
      ) : null}

      {zoomOpen ? <ZoomDialog photos={photos} index={index} onIndex={setIndex} onClose={() => setZoomOpen(false)} /> : null}
    </div>
  );
}

function ZoomDialog({
  photos,
  index,
  onIndex,
  onClose,
}: {
  photos: GalleryPhoto[];
  index: number;
  onIndex: (i: number) => void;
  onClose: () => void;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const frame = useRef<HTMLDivElement>(null);
  const [actual, setActual] = useState(false);
  const [focusPoint, setFocusPoint] = useState<{ x: number; y: number } | null>(null);
  const photo = photos[index];

  // No close() on cleanup: unmounting takes the dialog out of the top layer, and a close() here would
  // fire onClose during React's development double-mount and shut the dialog it just opened.
  useEffect(() => {
    const d = dialog.current;
    if (d && !d.open) d.showModal();
  }, []);

  // After switching to actual size, scroll so the point that was clicked sits in the middle.
  useEffect(() => {
    const f = frame.current;
    if (!actual || !f || !focusPoint) return;
    const img = f.querySelector("img");
    if (!img) return;
    const centre = () => {
      f.scrollLeft = focusPoint.x * img.naturalWidth - f.clientWidth / 2;
      f.scrollTop = focusPoint.y * img.naturalHeight - f.clientHeight / 2;
    };
    if (img.complete) centre();
    else img.addEventListener("load", centre, { once: true });
  }, [actual, focusPoint, index]);

  const step = (d: number) => onIndex((index + d + photos.length) % photos.length);
  const onKey = (e: KeyboardEvent) => {
    // In actual size the arrow keys scroll the photo; otherwise they step through the photos.
    if (actual && frame.current?.contains(document.activeElement)) return;
    if (e.key === "ArrowRight") step(1);
    else if (e.key === "ArrowLeft") step(-1);
    else return;
    e.preventDefault();
  };

  return (
    <dialog
      ref={dialog}
      aria-label={`Zoom: ${photo.alt}`}
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      onKeyDown={onKey}
      className="m-0 h-dvh max-h-none w-screen max-w-none bg-ink/95 p-0 text-card backdrop:bg-ink/80"
    >
      <div className="flex h-full flex-col">
        <div className="flex items-center justify-between gap-2 px-3 py-2 sm:px-5">
          <p className="figures text-sm text-card/80" aria-live="polite">
            Photo {index + 1} of {photos.length}
          </p>
          <div className="flex items-center gap-2">
            <button
              type="button"
              onClick={() => {
                setFocusPoint({ x: 0.5, y: 0.5 });
                setActual((a) => !a);
              }}
              aria-pressed={actual}
              className="h-9 rounded-md border border-card/30 px-3 text-sm font-medium text-card hover:bg-card/10"
            >
              {actual ? "Fit to screen" : "Actual size"}
            </button>
            <button
              type="button"
              onClick={onClose}
              className="h-9 rounded-md border border-card/30 px-3 text-sm font-medium text-card hover:bg-card/10"
              autoFocus
            >
              Close<span className="sr-only"> zoom</span>
            </button>
          </div>
        </div>
        <div
          ref={frame}
          tabIndex={actual ? 0 : -1}
          aria-label={actual ? "Photo at actual size; use the arrow keys to look around" : undefined}
          className={cx(
            "relative min-h-0 flex-1",
            actual ? "overflow-auto" : "flex items-center justify-center overflow-hidden p-2 sm:p-6",
          )}
        >
          <img
            key={photo.id}
            src={photo.zoomUrl}
            alt={photo.alt}
            onClick={(e) => {
              if (actual) return setActual(false);
              const r = e.currentTarget.getBoundingClientRect();
              setFocusPoint({ x: (e.clientX - r.left) / r.width, y: (e.clientY - r.top) / r.height });
              setActual(true);
            }}
            className={actual ? "max-w-none cursor-zoom-out" : "max-h-full max-w-full cursor-zoom-in object-contain"}
          />
        </div>
        {photos.length > 1 ? (
          <div className="flex items-center justify-center gap-3 px-3 py-3">
            <button
              type="button"
              onClick={() => step(-1)}
              className="h-10 rounded-md border border-card/30 px-4 text-sm font-medium text-card hover:bg-card/10"
            >
              ← Previous
            </button>
            <button
              type="button"
              onClick={() => step(1)}
              className="h-10 rounded-md border border-card/30 px-4 text-sm font-medium text-card hover:bg-card/10"
            >
              Next →
            </button>
          </div>
        ) : null}
      </div>
    </dialog>
  );
}
