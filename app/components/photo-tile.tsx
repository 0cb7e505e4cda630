import { useEffect, useRef, useState, type DragEvent } from "react";
import type { PhotoView } from "~/photos/limits";
import { Button } from "./Button";
import { cx } from "./cx";

// One photo in the seller's editor: its picture (or state), and the controls to move it, make it the
// cover or delete it. Every action has a button; dragging is only a shortcut.

export const PHOTO_DRAG_TYPE = "application/x-loadline-photo";

export interface PhotoTileProps {
  photo: PhotoView;
  index: number;
  count: number;
  /** This photo's delete is on its way. */
  deleting: boolean;
  onMove: (to: number) => void;
  onCover: () => void;
  onDelete: () => void;
  onDropPhoto: (photoId: string) => void;
}

export function PhotoTile({ photo, index, count, deleting, onMove, onCover, onDelete, onDropPhoto }: PhotoTileProps) {
  const [confirming, setConfirming] = useState(false);
  const [dropTarget, setDropTarget] = useState(false);
  const keepRef = useRef<HTMLButtonElement>(null);
  const n = index + 1;
  const label = `Photo ${n}${photo.isCover ? ", the cover" : ""}`;

  useEffect(() => {
    if (confirming) keepRef.current?.focus(); // the safe choice has focus
  }, [confirming]);

  const overTile = (e: DragEvent) => {
    if (!e.dataTransfer.types.includes(PHOTO_DRAG_TYPE)) return;
    e.preventDefault();
    e.dataTransfer.dropEffect = "move";
    setDropTarget(true);
  };

  return (
    <li
      data-photo-id={photo.id}
      aria-label={label}
      draggable={!deleting && !confirming}
      onDragStart={(e) => {
        e.dataTransfer.setData(PHOTO_DRAG_TYPE, photo.id);
        e.dataTransfer.effectAllowed = "move";
      }}
      onDragOver={overTile}
      onDragLeave={() => setDropTarget(false)}
      onDrop={(e) => {
        const id = e.dataTransfer.getData(PHOTO_DRAG_TYPE);
        setDropTarget(false);
        if (!id) return;
        e.preventDefault();
        e.stopPropagation();
        if (id !== photo.id) onDropPhoto(id);
      }}
      className={cx(
        "flex flex-col overflow-hidden rounded-panel border bg-card shadow-panel",
        photo.isCover ? "border-brass" : "border-rule",
        dropTarget && "ring-2 ring-walnut ring-offset-2 ring-offset-paper",
      )}
    >
      <div className="relative aspect-[4/3] overflow-hidden bg-sunk">
        <Picture photo={photo} n={n} />
        <span className="figures absolute left-2 top-2 rounded bg-ink/75 px-1.5 py-0.5 text-xs text-card">{n}</span>
        {photo.isCover ? (
          <span className="absolute right-2 top-2 rounded border border-brass/60 bg-brass-wash px-2 py-0.5 text-xs font-semibold text-brass-ink">
            Cover
          </span>
        ) : null}
      </div>

      {confirming ? (
        <div
          className="space-y-2 border-t border-rule bg-fault-wash p-3"
          role="group"
          aria-label={`Delete photo ${n}?`}
          onKeyDown={(e) => {
            if (e.key === "Escape") setConfirming(false);
          }}
        >
          <p className="text-sm text-ink">Delete photo {n}? Its stored sizes go too; this cannot be undone.</p>
          <div className="flex flex-wrap gap-2">
            <Button variant="danger" size="sm" busy={deleting} onClick={onDelete}>
              Delete photo
            </Button>
            <Button ref={keepRef} variant="secondary" size="sm" disabled={deleting} onClick={() => setConfirming(false)}>
              Keep
            </Button>
          </div>
        </div>
      ) : (
        <div className="space-y-1 border-t border-rule p-2">
          <Button
            variant={photo.isCover ? "secondary" : "quiet"}
            size="sm"
            data-action="cover"
            className={cx("w-full", photo.isCover && "border-brass text-brass-ink hover:border-brass hover:text-brass-ink")}
            aria-label={`Use photo ${n} as the cover`}
            aria-pressed={photo.isCover}
            disabled={photo.status === "failed"}
            onClick={() => !photo.isCover && onCover()}
          >
            {photo.isCover ? (
              <>
                <Tick /> Cover photo
              </>
            ) : (
              "Make cover"
            )}
          </Button>
          <div className="flex items-center gap-1">
            <Button
              variant="quiet"
              size="sm"
              data-action="earlier"
              className="px-2"
              aria-label={`Move photo ${n} earlier`}
              disabled={index === 0}
              onClick={() => onMove(index - 1)}
            >
              <Arrow direction="left" />
            </Button>
            <Button
              variant="quiet"
              size="sm"
              data-action="later"
              className="px-2"
              aria-label={`Move photo ${n} later`}
              disabled={index === count - 1}
              onClick={() => onMove(index + 1)}
            >
              <Arrow direction="right" />
            </Button>
            <Button
              variant="quiet"
              size="sm"
              data-action="delete"
              className="ml-auto text-fault hover:bg-fault-wash hover:text-fault"
              aria-label={`Delete photo ${n}`}
              onClick={() => setConfirming(true)}
            >
              Delete
            </Button>
          </div>
        </div>
      )}
    </li>
  );
}

function Picture({ photo, n }: { photo: PhotoView; n: number }) {
  if (photo.status === "ready" && photo.urls) {
    return (
      <img
        src={photo.urls.thumb}
        alt={`Photo ${n}`}
        width={photo.width ?? undefined}
        height={photo.height ?? undefined}
        loading="lazy"
        className="absolute inset-0 h-full w-full object-cover"
      />
    );
  }
  if (photo.status === "failed") {
    return (
      <div className="flex h-full flex-col justify-center gap-1 bg-fault-wash p-3 text-fault">
        <p className="text-sm font-semibold">Could not be processed</p>
        <p className="text-xs leading-snug">{photo.error}</p>
      </div>
    );
  }
  return (
    <div className="flex h-full flex-col items-center justify-center gap-2 text-ink-soft">
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-5 animate-spin text-walnut">
        <circle cx="8" cy="8" r="6" fill="none" stroke="currentColor" strokeOpacity="0.25" strokeWidth="2" />
        <path d="M14 8a6 6 0 0 0-6-6" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <p className="text-sm">Preparing sizes…</p>
    </div>
  );
}

function Tick() {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
      <path d="M3.5 8.5l3 3 6-7" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

function Arrow({ direction }: { direction: "left" | "right" }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
      <path
        d={direction === "left" ? "M10 3.5L5.5 8l4.5 4.5" : "M6 3.5L10.5 8 6 12.5"}
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
    </svg>
  );
}
