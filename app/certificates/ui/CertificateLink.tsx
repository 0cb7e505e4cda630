import { buttonClass } from "~/components/Button";

// The bench certificate's download on a bench-verified listing: for its seller to print and put in the
// box or show at a fair, and for a buyer to keep (docs/decisions/0033). A plain link, so it works
// without script and the browser saves the PDF itself.
export function CertificateLink({ listingId, isSeller }: { listingId: string; isSeller: boolean }) {
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <a href={`/listings/${listingId}/certificate.pdf`} download className={buttonClass("secondary", "sm")}>
        <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
          <path
            d="M8 2v8m-3.5-3.5L8 10l3.5-3.5M3 13h10"
            fill="none"
            stroke="currentColor"
            strokeWidth="1.6"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </svg>
        Bench certificate (PDF)
      </a>
      <p className="text-xs text-ink-faint">
        {isSeller ? "Print it for the box or a fair; its QR code" : "Its QR code"} leads to a page that says whether the bench sheet still
        matches.
      </p>
    </div>
  );
}
