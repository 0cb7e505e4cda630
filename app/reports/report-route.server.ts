import { data, redirect } from "react-router";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { listingReportPage, submitReport, threadReportPage } from "./reports.server";

// The loader and action behind both report pages (/listings/:id/report, /messages/:threadId/report):
// the two differ only in what is reported and where the page lives.

type Reported = "listing" | "thread";

const pageFor = { listing: listingReportPage, thread: threadReportPage } as const;
const pathFor = (kind: Reported, id: string) => (kind === "listing" ? `/listings/${id}/report` : `/messages/${id}/report`);

export async function reportPageLoader(request: Request, kind: Reported, id: string) {
  const user = await requireUser(request);
  try {
    const page = await pageFor[kind](user.id, id);
    return data(
      { page, sent: new URL(request.url).searchParams.get("sent") === "1" },
      { headers: { "Cache-Control": "private, no-store" } },
    );
  } catch (e) {
    pageError(e);
  }
}

export async function reportPageAction(request: Request, kind: Reported, id: string) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const fields = Object.fromEntries(await readPageForm(request));
  try {
    const done = await submitReport(user.id, kind, id, fields);
    if (done.ok) return redirect(`${pathFor(kind, id)}?sent=1`);
    return data({ errors: done.errors, values: done.values }, { status: done.status });
  } catch (e) {
    pageError(e);
  }
}
