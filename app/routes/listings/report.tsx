import type { Route } from "./+types/report";
import { reportPageAction, reportPageLoader } from "~/reports/report-route.server";
import { ReportView } from "~/reports/ui/ReportForm";

// /listings/:id/report: any signed-in account reports a public listing (not its own) to the review desk.

export const meta: Route.MetaFunction = () => [{ title: "Report a listing · Loadline" }, { name: "robots", content: "noindex" }];

export const loader = ({ request, params }: Route.LoaderArgs) => reportPageLoader(request, "listing", params.id);
export const action = ({ request, params }: Route.ActionArgs) => reportPageAction(request, "listing", params.id);

export default function ReportListing({ loaderData, actionData }: Route.ComponentProps) {
  return <ReportView page={loaderData.page} sent={loaderData.sent} errors={actionData?.errors} values={actionData?.values} />;
}
