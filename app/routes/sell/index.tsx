import type { ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/index";
import { hasRole, requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { redirectWithNotice } from "~/auth/session.server";
import { HttpError } from "~/http/errors.server";
import { ListingNotFound } from "~/listings/errors.server";
import { notFoundPage } from "~/listings/http.server";
import { inventoryPage } from "~/inventory/query.server";
import { runInventoryAction } from "~/inventory/actions.server";
import { formAction, type FormActionState } from "~/inventory/form-action";
import { InventoryView } from "~/inventory/ui/InventoryView";
import { inventoryParams, readInventoryQuery } from "@shared/inventory";

// /sell: the workshop's inventory. The loader renders the first page of the table (so it works without
// JavaScript); with JavaScript, filters, sorts and pages come from GET /api/v1/inventory and actions go
// to POST /api/v1/inventory through react-query. This action is the plain-form path of the same actions.

export const meta: Route.MetaFunction = () => [{ title: "Inventory · Sell · Loadline" }];

// With JavaScript the table fetches its own pages; the loader runs again only after a plain form post.
export function shouldRevalidate({ currentUrl, nextUrl, formMethod, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (formMethod && formMethod !== "GET") return defaultShouldRevalidate;
  return currentUrl.pathname === nextUrl.pathname ? false : defaultShouldRevalidate;
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const query = readInventoryQuery(new URL(request.url).searchParams);
  const page = await inventoryPage(user.id, query);
  return { page, params: inventoryParams({ ...query, page: page.page }).toString(), workshop: hasRole(user, "workshop") };
}

export async function action({ request }: Route.ActionArgs): Promise<FormActionState | Response> {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  const back = `/sell${new URL(request.url).search}`;
  const read = formAction(form);
  if (!read.ok) return read.state;
  try {
    const result = await runInventoryAction(user, read.action);
    if (result.action === "publish") return { ok: true, result };
    const n = result.outcomes.length;
    const units = n === 1 ? result.outcomes[0].title : `${n} units`;
    const done = {
      withdraw: `${units} ${n === 1 ? "is" : "are"} withdrawn and no longer on the market. You can publish ${n === 1 ? "it" : "them"} again.`,
      reprice: `New ${n === 1 ? "price" : "prices"} saved for ${units}.`,
      handling: `Handling time saved for ${units}.`,
      price: `New price saved for ${units}.`,
    }[result.action];
    return redirectWithNotice(request, back, done);
  } catch (e) {
    if (e instanceof ListingNotFound) notFoundPage();
    if (e instanceof HttpError && e.status < 500)
      return { ok: false, formError: e.message, issues: e.issues ?? [], ids: read.action.ids, intent: read.action.action };
    throw e;
  }
}

export default function SellIndex({ loaderData, actionData }: Route.ComponentProps) {
  return <InventoryView first={loaderData} actionData={actionData ?? null} />;
}
