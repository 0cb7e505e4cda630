import { data, redirect } from "react-router";
import type { Route } from "./+types/report";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { threadReportPage, submitReport } from "~/reports/reports.server";
import { ReportView } from "~/reports/ui/ReportForm";

// /messages/:threadId/report: either side of a conversation reports it to the review desk.

export const meta: Route.MetaFunction = () => [{ title: "Report a conversation · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  try {
    const page = await threadReportPage(user.id, params.threadId);
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
    const done = await submitReport(user.id, "thread", params.threadId, fields);
    if (done.ok) return redirect(`/messages/${params.threadId}/report?sent=1`);
    return data({ errors: done.errors, values: done.values }, { status: done.status });
  } catch (e) {
    pageError(e);
  }
}

export default function ReportThread({ loaderData, actionData }: Route.ComponentProps) {
  return <ReportView page={loaderData.page} sent={loaderData.sent} errors={actionData?.errors} values={actionData?.values} />;
}
