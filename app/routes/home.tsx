import { Link } from "react-router";
import type { Route } from "./+types/home";
import { CATEGORY_LABELS } from "@shared/catalogue";
import { homeData } from "~/catalogue/market.server";
import { buttonClass } from "~/components/Button";
import { BenchGlyph } from "~/components/BenchVerifiedMark";
import { ListingCard } from "~/components/ListingCard";
import { TraceArt } from "~/components/TraceArt";
import { SITE_DESCRIPTION } from "~/meta";

export async function loader() {
  return homeData();
}

export const meta: Route.MetaFunction = () => [
  { title: "Loadline · used and vintage hi-fi, measured and checked" },
  { name: "description", content: SITE_DESCRIPTION },
];

export default function Home({ loaderData }: Route.ComponentProps) {
  const { recentVerified, counts, totals } = loaderData;
  return (
    <main className="w-full">
      <section className="bench-grid border-b border-rule">
        <div className="mx-auto grid max-w-6xl items-center gap-10 px-4 py-12 sm:px-6 sm:py-16 lg:grid-cols-[1.25fr_1fr]">
          <div className="space-y-5">
            <p className="text-xs font-semibold uppercase tracking-[0.16em] text-brass-ink">Used &amp; vintage hi-fi</p>
            <h1 className="text-[2.25rem] leading-[1.1] sm:text-5xl">Choose your gear by what it measures today.</h1>
            <p className="max-w-xl text-lg text-ink-soft">
              Loadline is the market where restoration workshops and private sellers list amplifiers, turntables, tape decks and
              loudspeakers with their bench measurements, and the bench checks every figure against physics and the trade's standards before
              a unit earns the mark.
            </p>
            <div className="flex flex-wrap items-center gap-3 pt-1">
              <Link to="/market" className={buttonClass("primary", "lg")}>
                Browse the market
              </Link>
              <span className="inline-flex items-center gap-2 text-sm text-ink-soft">
                <BenchGlyph className="size-5 shrink-0 text-trace" />
                Bench-verified figures come with their conditions
              </span>
            </div>
            <dl className="grid max-w-lg grid-cols-3 gap-4 border-t border-rule pt-5">
              <Stat value={totals.live} label="units for sale" />
              <Stat value={totals.benchVerified} label="bench-verified" />
              <Stat value={totals.verifiedWorkshops} label="verified workshops" />
            </dl>
          </div>
          <TraceArt className="hidden w-full max-w-md justify-self-end drop-shadow-sm lg:block" />
        </div>
      </section>

      <section className="mx-auto max-w-6xl space-y-5 px-4 py-12 sm:px-6" aria-labelledby="recent">
        <div className="flex items-end justify-between gap-4">
          <div>
            <h2 id="recent" className="text-2xl sm:text-3xl">
              Recently bench-verified
            </h2>
            <p className="mt-1 text-ink-soft">The newest units whose sheets passed every check.</p>
          </div>
          <Link to="/market" className="hidden shrink-0 text-sm font-medium text-walnut underline-offset-4 hover:underline sm:inline">
            All units in the market →
          </Link>
        </div>
        {recentVerified.length ? (
          <ul className="grid grid-cols-1 gap-5 sm:grid-cols-2 lg:grid-cols-3">
            {recentVerified.map((l) => (
              <li key={l.id} className="flex min-w-0">
                <ListingCard listing={l} href={`/listings/${l.id}`} className="w-full" />
              </li>
            ))}
          </ul>
        ) : (
          <p className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-10 text-center text-ink-soft">
            No bench-verified units are for sale right now.
          </p>
        )}
        <Link to="/market" className="inline-block text-sm font-medium text-walnut underline-offset-4 hover:underline sm:hidden">
          All units in the market →
        </Link>
      </section>

      <section className="border-y border-rule bg-card/70" aria-labelledby="categories">
        <div className="mx-auto max-w-6xl space-y-5 px-4 py-12 sm:px-6">
          <h2 id="categories" className="text-2xl sm:text-3xl">
            Browse by category
          </h2>
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            {counts.map(({ category, live }) => (
              <li key={category}>
                <Link
                  to={`/market?category=${CATEGORY_LABELS[category].slug}`}
                  className="group flex h-full flex-col justify-between gap-3 rounded-panel border border-rule bg-paper px-4 py-3.5 no-underline transition-colors hover:border-walnut"
                >
                  <span className="font-serif text-[1.0625rem] font-semibold leading-snug text-ink group-hover:text-walnut-deep">
                    {CATEGORY_LABELS[category].many}
                  </span>
                  <span className="text-sm text-ink-faint">
                    <span className="figures">{live}</span> for sale
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </div>
      </section>

      <section className="mx-auto max-w-6xl px-4 py-12 sm:px-6" aria-labelledby="how">
        <h2 id="how" className="text-2xl sm:text-3xl">
          How a unit earns the mark
        </h2>
        <ol className="mt-6 grid gap-6 sm:grid-cols-3">
          <Step n={1} title="The seller measures">
            A workshop or private seller fills in the bench sheet: each reading with its load, frequency, level and distortion limit, and
            raw captures where they have them.
          </Step>
          <Step n={2} title="The bench checks">
            Power against voltage and load, 4 Ω against 8 Ω, distortion against bandwidth, both channels against each other: each check
            comes out consistent, questionable, implausible or missing.
          </Step>
          <Step n={3} title="You read the figures">
            A sheet that passes every check carries the bench-verified mark. A sheet with an implausible figure is held for a moderator
            before it reaches the market.
          </Step>
        </ol>
      </section>
    </main>
  );
}

function Stat({ value, label }: { value: number; label: string }) {
  // Label after the number on screen, before it for screen readers.
  return (
    <div className="flex flex-col-reverse justify-end">
      <dt className="text-sm text-ink-faint">{label}</dt>
      <dd className="figures text-2xl font-medium text-ink">{value}</dd>
    </div>
  );
}

function Step({ n, title, children }: { n: number; title: string; children: React.ReactNode }) {
  return (
    <li className="space-y-2 border-t-2 border-walnut pt-4">
      <p className="figures text-sm text-brass-ink">0{n}</p>
      <h3 className="text-lg">{title}</h3>
      <p className="text-ink-soft">{children}</p>
    </li>
  );
}
