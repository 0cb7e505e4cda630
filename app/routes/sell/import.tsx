import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/import";
import { requireRole } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { HttpError } from "~/http/errors.server";
import { recentImports, startImport } from "~/imports/imports.server";
import { readCsvUpload } from "~/imports/upload.server";
import { MAX_IMPORT_BYTES, MAX_INVENTORY_ROWS, type ImportProblem } from "~/imports/check-csv";
import { ColumnGuide } from "~/imports/ui/ColumnGuide";
import { Button, ButtonLink } from "~/components/Button";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { Section } from "~/sell/Section";

// Bulk import for workshops: a CSV of units in Loadline's inventory layout becomes drafts. The whole
// file is checked first; with any problem, the page lists them (row, column, message) and nothing is
// written. A clean file is imported whole, then the workshop adds photos to each draft.

export const meta: Route.MetaFunction = () => [{ title: "Import units · Sell · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireRole(request, "workshop");
  return { imports: await recentImports(user.id) };
}

type Failure = {
  fileName?: string;
  formError?: string;
  problems: ImportProblem[];
  problemCount: number;
  rowsWithProblems: number;
  rowCount: number;
};

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireRole(request, "workshop");
  const refused = (f: Partial<Failure>, status = 400) =>
    data<Failure>({ problems: [], problemCount: 0, rowsWithProblems: 0, rowCount: 0, ...f }, { status });
  try {
    const { fileName, text } = await readCsvUpload(request);
    const started = await startImport(user.id, fileName, text);
    if (!started.ok) return refused({ fileName, ...started.check });
    return redirect(`/sell/import/${started.import.id}`);
  } catch (e) {
    if (e instanceof HttpError && e.status < 500) return refused({ formError: e.message }, e.status);
    throw e;
  }
}

const MB = MAX_IMPORT_BYTES / 1024 / 1024;

function Problems({ failure }: { failure: Failure }) {
  const more = failure.problemCount - failure.problems.length;
  return (
    <section aria-labelledby="problems-title" className="space-y-3" data-problem-count={failure.problemCount}>
      <h2 id="problems-title" className="text-xl text-fault">
        {failure.problemCount} problem{failure.problemCount === 1 ? "" : "s"} in {failure.rowsWithProblems} row
        {failure.rowsWithProblems === 1 ? "" : "s"}: nothing was imported
      </h2>
      <p className="text-ink-soft">
        {failure.fileName ? <>In {failure.fileName}: fix</> : "Fix"} these in your spreadsheet and send the file again. Rows are numbered as
        your spreadsheet shows them; the header is row 1.
      </p>
      <div className="overflow-x-auto rounded-panel border border-rule bg-card shadow-panel">
        <table className="w-full text-left text-sm">
          <thead className="border-b border-rule bg-sunk/60 text-xs uppercase tracking-wider text-ink-faint">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Row
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Column
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Problem
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {failure.problems.map((p, i) => (
              <tr key={i} data-row={p.row} data-column={p.column}>
                <td className="figures px-3 py-2 align-top">{p.row}</td>
                <td className="px-3 py-2 align-top font-mono text-[0.8125rem]">{p.column === "row" ? "—" : p.column}</td>
                <td className="px-3 py-2 align-top text-ink">{p.message}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {more > 0 ? <p className="text-sm text-ink-soft">…and {more} more; the first ones are listed.</p> : null}
    </section>
  );
}

export default function ImportPage({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const failure = actionData;
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell"
        title="Import units from a CSV file"
        lede="One row per unit, in Loadline's inventory layout. Every row is checked before anything is written; a file goes in whole or not at all, as drafts you then complete with photos."
        actions={
          <ButtonLink to="/sell" variant="secondary">
            Your listings
          </ButtonLink>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
        <div className="space-y-6">
          <Section
            title="Send a file"
            lede={`A .csv file of at most ${MB} MB and ${MAX_INVENTORY_ROWS.toLocaleString("en-GB")} units, saved as “CSV UTF-8”.`}
          >
            <Form method="post" encType="multipart/form-data" className="space-y-4" aria-label="Import a CSV file">
              <FormError>{failure?.formError}</FormError>
              <label className="block space-y-1.5">
                <span className="text-sm font-medium text-ink">CSV file</span>
                <input
                  type="file"
                  name="file"
                  accept=".csv,text/csv"
                  required
                  className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-card file:px-3 file:py-2 file:text-sm file:font-medium"
                />
              </label>
              <Button type="submit" busy={busy}>
                Check and import
              </Button>
            </Form>
          </Section>
          {failure && failure.problemCount > 0 ? <Problems failure={failure} /> : null}
          <Section title="The columns" lede="Column order does not matter; blank cells are fine. Lines starting with # are skipped.">
            <ColumnGuide />
          </Section>
        </div>
        <aside className="space-y-6">
          <Section title="Start from our files">
            <ul className="space-y-2 text-sm">
              <li>
                <a href="/sell/import/template.csv" download>
                  The template
                </a>
                <span className="block text-ink-soft">The header and a line of help.</span>
              </li>
              <li>
                <a href="/sell/import/example.csv" download>
                  An example
                </a>
                <span className="block text-ink-soft">Four invented units, three with measured figures.</span>
              </li>
            </ul>
          </Section>
          {loaderData.imports.length ? (
            <Section title="Your latest imports">
              <ul className="space-y-2 text-sm">
                {loaderData.imports.map((i) => (
                  <li key={i.id} className="flex items-baseline justify-between gap-2">
                    <a href={`/sell/import/${i.id}`} className="min-w-0 truncate">
                      {i.fileName}
                    </a>
                    <span className="shrink-0 text-ink-soft">
                      {i.status === "done" ? `${i.totalRows} drafts` : i.status === "failed" ? "not imported" : "running"}
                    </span>
                  </li>
                ))}
              </ul>
            </Section>
          ) : null}
        </aside>
      </div>
    </main>
  );
}
