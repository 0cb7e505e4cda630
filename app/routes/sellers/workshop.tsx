import { data, isRouteErrorResponse } from "react-router";
import type { Route } from "./+types/workshop";
import { ErrorPage } from "~/components/ErrorPage";
import { workshopProfile } from "~/reputation/profile.server";
import { ProfilePage } from "~/reputation/ui/ProfilePage";

// /workshops/:slug: a workshop's public page (a refused application, or a suspended owner, has none).

export async function loader({ params }: Route.LoaderArgs) {
  const profile = await workshopProfile(params.slug);
  if (!profile) throw data({ message: "There is no workshop here." }, { status: 404, statusText: "Not Found" });
  return data({ profile }, { headers: { "Cache-Control": "private, no-store" } });
}

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page?.profile.workshop ? `${page.profile.workshop.name} · Workshops · Loadline` : "No workshop here · Loadline" }];
}

export default function WorkshopPage({ loaderData }: Route.ComponentProps) {
  return <ProfilePage profile={loaderData.profile} />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
