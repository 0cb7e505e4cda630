import { data, isRouteErrorResponse, Link } from "react-router";
import type { Route } from "./+types/certificate";
import { certificateStatus } from "~/certificates/status.server";
import { ErrorPage } from "~/components/ErrorPage";
import { PageHeader } from "~/components/PageHeader";
import { BenchGlyph } from "~/components/BenchVerifiedMark";

// Where a certificate's QR code leads: open to anyone holding the paper. It says whether the bench
// sheet on Loadline is still the one certified, or since when it has been superseded.

export async function loader({ params }: Route.LoaderArgs) {
  const status = await certificateStatus(params.id);
  if (!status) throw data({ message: "There is no bench certificate with that id." }, { status: 404, statusText: "Not Found" });
  // The answer changes the moment the sheet does: never from a cache.
  return data(status, { headers: { "Cache-Control": "no-store" } });
}

export const meta: Route.MetaFunction = ({ data: status }) => [
  { title: status ? `Bench certificate: ${status.listing.title} · Loadline` : "No such certificate · Loadline" },
  { name: "robots", content: "noindex" },
];

const day = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const dayTime = (iso: string) => `${day.format(new Date(iso))}, ${iso.slice(11, 16)} UTC`;

export default function CertificatePage({ loaderData: s }: Route.ComponentProps) {
  const matches = s.state === "matches";
  return (
    <main className="mx-auto w-full max-w-3xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader overline="Bench certificate" title={s.listing.title} lede={`Listed by ${s.listedBy}. Issued ${dayTime(s.issuedAt)}.`} />
      <section
        aria-labelledby="verdict"
        className={`flex gap-3 rounded-panel border p-5 ${matches ? "border-trace/35 bg-trace-wash text-trace" : "border-brass/50 bg-brass-wash text-brass-ink"}`}
      >
        <BenchGlyph className="mt-1 size-6 shrink-0" />
        <div className="space-y-1">
          <h2 id="verdict" className="text-xl">
            {matches ? "This certificate matches the current bench sheet." : "This certificate has been superseded."}
          </h2>
          <p className="text-sm text-ink-soft">
            {matches
              ? "The figures, conditions and plots on the certificate are the bench sheet Loadline holds for this unit today."
              : `The bench sheet changed on ${dayTime(s.supersededAt!)}, after this certificate was issued: its figures may no longer be the unit's. Read the listing's bench sheet as it is now${s.listing.publicPage ? "" : " (ask the seller; the listing is not on the market)"}.`}
          </p>
        </div>
      </section>
      <dl className="grid gap-x-6 gap-y-2 rounded-panel border border-rule bg-card p-5 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className="text-ink-soft">Certificate</dt>
        <dd className="figures break-all">{s.id}</dd>
        <dt className="text-ink-soft">Bench sheet fingerprint</dt>
        <dd className="figures">{s.fingerprint}</dd>
        <dt className="text-ink-soft">Issued</dt>
        <dd>{dayTime(s.issuedAt)}</dd>
        <dt className="text-ink-soft">Status</dt>
        <dd>{matches ? "Matches the current bench sheet" : `Superseded since ${dayTime(s.supersededAt!)}`}</dd>
        <dt className="text-ink-soft">Bench-verified today</dt>
        <dd>{s.listing.benchVerified ? "Yes" : "No"}</dd>
      </dl>
      {s.listing.publicPage ? (
        <p>
          <Link to={`/listings/${s.listing.id}`} className="font-medium text-walnut underline-offset-2 hover:text-walnut-deep">
            The listing and its bench sheet
          </Link>
        </p>
      ) : null}
    </main>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
