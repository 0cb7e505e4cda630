import { Card } from "~/components/Card";
import { OFFER_STATE_LABELS } from "@shared/offers";
import type { ContestCaptureView } from "../desk-order.server";
import type { DeskThread } from "../desk-thread.server";
import type { ContestPhotoLink } from "~/orders/contest-photo-links.server";
import { Money } from "./Money";
import { When } from "./OrderParts";

// The contest's evidence on the desk beyond its words: the buyer's photos (each a short-lived link made
// for this moderator), their captures and what became of them, and the two sides' conversation, read-only.

const linkClass = "font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep";

const CAPTURE_STATUS: Record<ContestCaptureView["status"], string> = {
  queued: "waiting to be analysed",
  running: "being analysed",
  done: "analysed",
  failed: "refused",
};

export function ContestPhotos({ photos, whose = "The buyer's" }: { photos: ContestPhotoLink[]; whose?: "The buyer's" | "Your" }) {
  if (!photos.length) return null;
  return (
    <div className="space-y-2">
      <h3 className="text-sm font-semibold text-ink">Photos</h3>
      <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4" data-testid="contest-photos">
        {photos.map((p, i) => (
          <li key={p.href}>
            {p.ready ? (
              <a href={p.href} target="_blank" rel="noreferrer" className="block overflow-hidden rounded-md border border-rule bg-sunk">
                <img src={p.href} alt={`${whose} photo ${i + 1}`} loading="lazy" className="aspect-[4/3] w-full object-cover" />
                <span className={`block px-2 py-1 text-xs ${linkClass}`}>Open photo {i + 1}</span>
              </a>
            ) : (
              <p className="rounded-md border border-dashed border-rule p-2 text-xs text-ink-faint">Photo {i + 1} is being prepared.</p>
            )}
          </li>
        ))}
      </ul>
      <p className="text-xs text-ink-faint">Shown without their metadata; each link works for you alone, for a few minutes.</p>
    </div>
  );
}

export function ContestCaptures({ captures }: { captures: ContestCaptureView[] }) {
  if (!captures.length) return null;
  return (
    <div className="space-y-1">
      <h3 className="text-sm font-semibold text-ink">Captures</h3>
      <ul className="space-y-1 text-sm" data-testid="contest-captures">
        {captures.map((c) => (
          <li key={c.id} data-status={c.status}>
            <span className="font-mono text-xs">{c.fileName}</span> · {CAPTURE_STATUS[c.status]}
            {c.status === "done" ? ` · ${c.readings} figure${c.readings === 1 ? "" : "s"} in the comparison below` : null}
            {c.error ? <span className="block text-xs text-fault">{c.error}</span> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}

export function DeskThreadCard({ thread, buyer, seller }: { thread: DeskThread | null; buyer: string; seller: string }) {
  const name = (from: "buyer" | "seller") => (from === "buyer" ? `${buyer} (buyer)` : `${seller} (seller)`);
  return (
    <Card className="space-y-3" aria-labelledby="desk-thread">
      <h2 id="desk-thread" className="text-xl">
        Their conversation
      </h2>
      {!thread || !thread.items.length ? (
        <p className="text-sm text-ink-soft">The buyer and the seller did not write to each other about this unit.</p>
      ) : (
        <ol className="max-h-[28rem] space-y-3 overflow-y-auto pr-1" data-testid="desk-thread">
          {thread.items.map((item) => (
            <li key={item.id} className="space-y-0.5 border-l-2 border-rule pl-3">
              <p className="text-xs text-ink-faint">
                {name(item.from)} · <When iso={item.at} />
              </p>
              {item.kind === "message" ? (
                <p className="whitespace-pre-line text-sm text-ink">
                  {item.body}
                  {item.masked ? <span className="block text-xs text-ink-faint">Contact details were masked when it was sent.</span> : null}
                </p>
              ) : (
                <p className="text-sm text-ink">
                  Offer of <Money minor={item.amountMinor} currency={item.currency} /> · {OFFER_STATE_LABELS[item.state].toLowerCase()}
                </p>
              )}
            </li>
          ))}
        </ol>
      )}
      <p className="text-xs text-ink-faint">Read-only: moderators do not write here, and reading marks nothing as read.</p>
    </Card>
  );
}
