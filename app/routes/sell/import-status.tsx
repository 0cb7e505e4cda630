import { data } from "react-router";
import type { Route } from "./+types/import-status";
import { requireRole } from "~/auth/guards.server";
import { pageError } from "~/http/errors.server";
import { ownImport } from "~/imports/imports.server";
import { ImportProgress } from "~/imports/ui/ImportProgress";
import { PageHeader } from "~/components/PageHeader";
import { Card } from "~/components/Card";

// One import's page: its progress while the job writes the drafts, then the outcome.

export const meta: Route.MetaFunction = ({ data: page }) => [
  { title: page ? `Importing ${page.import.fileName} · Sell · Loadline` : "Import · Sell · Loadline" },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireRole(request, "workshop");
  try {
    return data({ import: await ownImport(user.id, params.id) }, { headers: { "Cache-Control": "private, no-store" } });
  } catch (e) {
    pageError(e);
  }
}

export default function ImportStatus({ loaderData }: Route.ComponentProps) {
  const imp = loaderData.import;
  return (
    <main className="mx-auto w-full max-w-3xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell · Import"
        title={imp.fileName}
        lede={`${imp.totalRows.toLocaleString("en-GB")} units, imported as drafts.`}
      />
      <Card>
        <ImportProgress initial={imp} />
      </Card>
    </main>
  );
}
