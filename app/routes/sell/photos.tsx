import { Link, useRevalidator } from "react-router";
import { PhotoUploader } from "~/components/photo-uploader";
import { Card } from "~/components/Card";
import { useEditor } from "./editor";

// The photo uploader (its own API under /api/v1/listings/:id/photos) inside the editor. Photos upload as
// they are chosen; the editor's checklist is refreshed when the list changes.
export default function PhotosStep() {
  const { listing, photos } = useEditor();
  const revalidator = useRevalidator();
  const readyBefore = photos.filter((p) => p.status === "ready").length;
  return (
    <div className="space-y-5">
      <Card className="space-y-4">
        <p className="text-sm text-ink-soft">
          Show the front, the back panel with its connectors and mains label, the inside after the work, and every mark you mention in the
          condition note.
        </p>
        <PhotoUploader
          listingId={listing.id}
          initialPhotos={photos}
          onChange={(next) => {
            const ready = next.filter((p) => p.status === "ready").length;
            if (ready !== readyBefore && revalidator.state === "idle") void revalidator.revalidate();
          }}
        />
        <noscript>
          <p className="text-sm text-fault">Uploading photos needs JavaScript. Every other step works without it.</p>
        </noscript>
      </Card>
      <p className="text-sm text-ink-soft">
        Photos are stripped of their metadata (including location) before anyone else sees them.{" "}
        <Link to={`/sell/${listing.id}/bench`}>Next: the bench sheet →</Link>
      </p>
    </div>
  );
}
