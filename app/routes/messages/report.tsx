import type { Route } from "./+types/report";
import { reportPageAction, reportPageLoader } from "~/reports/report-route.server";
import { ReportView } from "~/reports/ui/ReportForm";

// /messages/:threadId/report: either side of a conversation reports it to the review desk.

export const meta: Route.MetaFunction = () => [{ title: "Report a conversation · Loadline" }, { name: "robots", content: "noindex" }];

export const loader = ({ request, params }: Route.LoaderArgs) => reportPageLoader(request, "thread", params.threadId);
export const action = ({ request, params }: Route.ActionArgs) => reportPageAction(request, "thread", params.threadId);

export default function ReportThread({ loaderData, actionData }: Route.ComponentProps) {
  return <ReportView page={loaderData.page} sent={loaderData.sent} errors={actionData?.errors} values={actionData?.values} />;
}
