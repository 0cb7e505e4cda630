import { data, isRouteErrorResponse, redirect } from "react-router";
import type { Route } from "./+types/seller";
import { ErrorPage } from "~/components/ErrorPage";
import { sellerProfile } from "~/reputation/profile.server";
import { ProfilePage } from "~/reputation/ui/ProfilePage";

// /sellers/:id: a private seller's public page. A seller with a workshop is sent to the workshop's page;
// an account that has never put a unit in the market, or is suspended, has none (404).

export async function loader({ params }: Route.LoaderArgs) {
  const profile = await sellerProfile(params.id);
  if (!profile) throw data({ message: "There is no seller here." }, { status: 404, statusText: "Not Found" });
  if ("redirect" in profile) throw redirect(profile.redirect);
  return data({ profile }, { headers: { "Cache-Control": "private, no-store" } });
}

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `${page.profile.seller.name} · Sellers · Loadline` : "No seller here · Loadline" }];
}

export default function SellerPage({ loaderData }: Route.ComponentProps) {
  return <ProfilePage profile={loaderData.profile} />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
