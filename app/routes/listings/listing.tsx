import { data, isRouteErrorResponse, Link } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/listing";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { getUser, requireUser } from "~/auth/guards.server";
import { ErrorPage } from "~/components/ErrorPage";
import { CATEGORY_LABELS } from "@shared/catalogue";
import { loadListingPage } from "~/listings/public.server";
import { setWatch } from "~/listings/watch.server";
import { BenchSheetSection, KeyFigures } from "~/listings/ui/BenchSheetSection";
import { UnsafeToConnect } from "~/listings/ui/UnsafeToConnect";
import { Gallery } from "~/listings/ui/Gallery";
import { ListingTitle, OwnerLinks, PriceAndCondition, StatusBanner, WatchControl } from "~/listings/ui/ListingHeader";
import { Plots } from "~/listings/ui/Plots";
import { TalkControls } from "~/listings/ui/TalkControls";
import { RestorationLog } from "~/listings/ui/RestorationLog";
import { SafetyCautions, SellerCard, ShippingPanel } from "~/listings/ui/SidePanels";
import { UnitDetails } from "~/listings/ui/UnitDetails";
import { CompareToggle } from "~/compare/ui/CompareToggle";
import { buyState } from "~/buying/buy-state.server";
import { BuyPanel } from "~/buying/ui/BuyPanel";
import { listingReputation } from "~/reputation/listing-panels.server";
import { SoldPriceIndexPanel } from "~/reputation/ui/SoldPriceIndexPanel";
import { CertificateLink } from "~/certificates/ui/CertificateLink";

export async function loader({ request, params }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const viewer = await getUser(request);
  const page = await loadListingPage({
    id: params.id,
    viewer,
    zone: url.searchParams.get("zone"),
    acceptLanguage: request.headers.get("Accept-Language"),
  });
  if (!page) throw data({ message: "There is no listing here." }, { status: 404, statusText: "Not Found" });
  const photo = Number(url.searchParams.get("photo"));
  const [buy, reputation] = await Promise.all([buyState(page.listing.id, viewer), listingReputation(page.listing.id)]);
  // The page differs per viewer (watch state, held banner): never from a shared cache.
  return data(
    { ...page, buy, reputation, initialPhoto: Number.isInteger(photo) && photo > 0 ? photo - 1 : 0 },
    { headers: { "Cache-Control": "private, no-store" } },
  );
}

const WatchForm = z.object({ intent: z.enum(["watch", "unwatch"], { message: "Choose watch or unwatch." }) });

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request, { redirectTo: `/listings/${params.id}` });
  const parsed = WatchForm.safeParse(Object.fromEntries(await readPageForm(request)));
  if (!parsed.success) return data({ reason: parsed.error.issues[0].message, path: "intent" }, { status: 400 });
  const result = await setWatch(user, params.id, parsed.data.intent === "watch");
  if (!result.ok) {
    if (result.status === 404) throw data({ message: result.reason }, { status: 404, statusText: "Not Found" });
    return data({ reason: result.reason }, { status: result.status });
  }
  return { watching: result.watching };
}

export function meta({ data: page }: Route.MetaArgs) {
  if (!page) return [{ title: "No listing here · Loadline" }];
  const l = page.listing;
  const lead = page.keyFigures[0];
  const description = [l.categoryLabel, l.era, lead ? `${lead.label} ${lead.value} ${lead.unit} ${lead.conditions}` : null, l.priceText]
    .filter(Boolean)
    .join(" · ");
  return [
    { title: `${l.title} · Loadline` },
    { name: "description", content: description },
    ...(l.status === "live" || l.status === "sold" ? [] : [{ name: "robots", content: "noindex" }]),
  ];
}

export default function ListingPage({ loaderData }: Route.ComponentProps) {
  const { listing, viewer, photos, keyFigures, bench, plots, restoration, seller, shipping, initialPhoto, buy, reputation } = loaderData;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-10 px-4 pb-16 pt-6 sm:px-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-faint">
        <Link to="/market" className="no-underline hover:text-walnut">
          Market
        </Link>
        <span aria-hidden="true"> / </span>
        <Link to={`/market?category=${CATEGORY_LABELS[listing.category].slug}`} className="no-underline hover:text-walnut">
          {CATEGORY_LABELS[listing.category].many}
        </Link>
      </nav>

      <StatusBanner listing={listing} viewer={viewer} />

      <div className="grid gap-8 lg:grid-cols-12 lg:gap-10">
        <div className="lg:col-span-7">
          <Gallery photos={photos} initial={initialPhoto} title={listing.title} />
        </div>
        <div className="space-y-6 lg:col-span-5">
          <ListingTitle listing={listing} />
          <PriceAndCondition listing={listing} />
          {/* Buy beside the conversation's buttons: one row of ways to get this unit. */}
          <BuyPanel state={buy}>
            <TalkControls listing={listing} viewer={viewer} />
          </BuyPanel>
          <WatchControl listing={listing} viewer={viewer} />
          {listing.status === "live" || listing.status === "sold" ? <CompareToggle listingId={listing.id} layout="page" /> : null}
          <OwnerLinks listing={listing} viewer={viewer} />
          {bench?.hazards.length ? <UnsafeToConnect hazards={bench.hazards} /> : null}
          <div className="border-t border-rule pt-5">
            <KeyFigures figures={keyFigures} verified={listing.benchVerified} />
          </div>
          {listing.benchVerified && bench?.verified ? <CertificateLink listingId={listing.id} isSeller={viewer.isSeller} /> : null}
        </div>
      </div>

      <div className="grid gap-10 lg:grid-cols-12">
        <aside className="space-y-5 lg:col-span-4 lg:col-start-9 lg:row-start-1" aria-label="Seller and delivery">
          <SellerCard seller={seller} standing={reputation?.seller} />
          {reputation?.index ? <SoldPriceIndexPanel index={reputation.index} title={listing.title} /> : null}
          <ShippingPanel shipping={shipping} currency={listing.currency} />
          <SafetyCautions listing={listing} />
          {viewer.isSeller ? null : (
            <p className="text-sm">
              <Link to={`/listings/${listing.id}/report`} className="text-ink-soft underline-offset-2 hover:text-walnut" rel="nofollow">
                Report this listing
              </Link>
            </p>
          )}
        </aside>
        <div className="min-w-0 space-y-12 lg:col-span-8 lg:row-start-1">
          <Plots plots={plots} />
          {bench ? (
            <BenchSheetSection bench={bench} listingVerified={listing.benchVerified} />
          ) : (
            <section className="space-y-2">
              <h2 className="text-2xl">Bench sheet</h2>
              <p className="text-sm text-ink-soft">The seller has not given a bench sheet for this unit.</p>
            </section>
          )}
          <RestorationLog entries={restoration} />
          <UnitDetails listing={listing} />
        </div>
      </div>
    </main>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
