import { data, isRouteErrorResponse, redirect } from "react-router";
import type { Route } from "./+types/compare";
import { ErrorPage } from "~/components/ErrorPage";
import { loadComparison } from "~/compare/compare.server";
import { readCompareList } from "~/compare/compare-list.server";
import { changeCompareList } from "~/compare/action.server";
import { compareHref, parseCompareIds } from "~/compare/selection";
import { ComparePage } from "~/compare/ui/ComparePage";

// Compare: up to four live or sold units side by side, named in `?ids=`. Without `ids` the page opens
// the visitor's own compare list (a cookie); the action adds, removes and clears that list.

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const asked = url.searchParams.getAll("ids");
  const list = await readCompareList(request);
  if (!asked.length && list.length) throw redirect(compareHref(list));
  const headers = { "Cache-Control": "private, no-store" };
  const parsed = parseCompareIds(asked);
  if (!parsed.ok) {
    const first = parsed.first ? compareHref(parsed.first) : null;
    return data({ problem: { message: parsed.message, first }, comparison: null, list }, { status: 400, headers });
  }
  return data({ problem: null, comparison: await loadComparison(parsed.ids), list }, { headers });
}

export async function action({ request }: Route.ActionArgs) {
  return changeCompareList(request);
}

export const meta: Route.MetaFunction = ({ data: page }) => {
  const names = page?.comparison?.units.map((u) => u.shortName) ?? [];
  return [
    { title: names.length > 1 ? `${names.join(" vs ")} · Compare · Loadline` : "Compare · Loadline" },
    { name: "description", content: "Units side by side on Loadline: the figures each measured on the bench, with their conditions." },
    // Any set of ids makes a page: one to share, not one for search engines to index.
    { name: "robots", content: "noindex" },
  ];
};

export default function Compare({ loaderData, actionData }: Route.ComponentProps) {
  return <ComparePage {...loaderData} refusal={actionData && !actionData.ok ? actionData.reason : null} />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
