import { data, redirect } from "react-router";
import type { Route } from "./+types/report";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { listingReportPage, submitReport } from "~/reports/reports.server";
import { ReportView } from "~/reports/ui/ReportForm";

// /listings/:id/report: any signed-in account reports a public listing (not its own) to the review desk.

export const meta: Route.MetaFunction = () => [{ title: "Report a listing · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  try {
    const page = await listingReportPage(user.id, params.id);
    return data(
      { page, sent: new URL(request.url).searchParams.get("sent") === "1" },
      { headers: { "Cache-Control": "private, no-store" } },
    );
  } catch (e) {
    pageError(e);
  }
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const fields = Object.fromEntries(await readPageForm(request));
  try {
    const done = await submitReport(user.id, "listing", params.id, fields);
    if (done.ok) return redirect(`/listings/${params.id}/report?sent=1`);
    return data({ errors: done.errors, values: done.values }, { status: done.status });
  } catch (e) {
    pageError(e);
  }
}

export default function ReportListing({ loaderData, actionData }: Route.ComponentProps) {
  return <ReportView page={loaderData.page} sent={loaderData.sent} errors={actionData?.errors} values={actionData?.values} />;
}
