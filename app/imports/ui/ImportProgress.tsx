import { useQuery } from "@tanstack/react-query";
import { ButtonLink } from "~/components/Button";
import type { ImportView } from "../imports.server";

// An import's progress: the page's loader data first, then GET /api/v1/imports/:id every second while it
// runs (react-query). Without JavaScript the page reloads itself instead (a meta refresh in <noscript>).

const running = (i: ImportView) => i.status === "queued" || i.status === "running";

async function fetchImport(id: string): Promise<ImportView> {
  const res = await fetch(`/api/v1/imports/${id}`, { headers: { Accept: "application/json" } });
  if (!res.ok) throw new Error(`The import's status did not load (${res.status}).`);
  return ((await res.json()) as { import: ImportView }).import;
}

export function ImportProgress({ initial }: { initial: ImportView }) {
  const { data } = useQuery({
    queryKey: ["import", initial.id],
    queryFn: () => fetchImport(initial.id),
    initialData: initial,
    staleTime: 0,
    refetchInterval: (q) => (q.state.data && running(q.state.data) ? 1000 : false),
  });
  const i = data ?? initial;
  const percent = i.totalRows ? Math.round((100 * i.doneRows) / i.totalRows) : 0;
  return (
    <div className="space-y-4" data-import-status={i.status}>
      {running(i) ? (
        <noscript>
          <meta httpEquiv="refresh" content="2" />
        </noscript>
      ) : null}
      <div className="space-y-2">
        <div className="flex items-baseline justify-between gap-3 text-sm">
          <span className="font-medium text-ink" aria-live="polite">
            {i.status === "queued"
              ? "Waiting to start…"
              : i.status === "running"
                ? `Writing drafts: ${i.doneRows.toLocaleString("en-GB")} of ${i.totalRows.toLocaleString("en-GB")}`
                : i.status === "done"
                  ? `${i.totalRows.toLocaleString("en-GB")} draft${i.totalRows === 1 ? "" : "s"} created`
                  : "Nothing was imported"}
          </span>
          <span className="figures text-ink-soft">{i.status === "done" ? 100 : percent} %</span>
        </div>
        <div
          role="progressbar"
          aria-label="Import progress"
          aria-valuemin={0}
          aria-valuemax={i.totalRows}
          aria-valuenow={i.status === "done" ? i.totalRows : i.doneRows}
          className="h-3 overflow-hidden rounded-full bg-sunk"
        >
          <div
            className={
              i.status === "failed"
                ? "h-full bg-fault"
                : running(i)
                  ? "h-full bg-walnut transition-[width] duration-500"
                  : "h-full bg-walnut"
            }
            style={{ width: `${i.status === "done" ? 100 : i.status === "failed" ? 100 : percent}%` }}
          />
        </div>
        {running(i) ? (
          <p className="text-sm text-ink-soft">
            The drafts appear together when the whole file is written; if anything fails, none are kept.
          </p>
        ) : null}
      </div>
      {i.status === "done" ? (
        <div className="space-y-3">
          <p className="text-ink-soft">
            Each unit is a draft: add photos, the restoration log and anything else it needs, then publish it from its review step.
          </p>
          <div className="flex flex-wrap gap-2">
            <ButtonLink to="/sell">Go to your listings</ButtonLink>
            <ButtonLink to="/sell/import" variant="secondary">
              Import another file
            </ButtonLink>
          </div>
        </div>
      ) : null}
      {i.status === "failed" ? (
        <div className="space-y-3">
          <p role="alert" className="font-medium text-fault">
            {i.error}
          </p>
          <ButtonLink to="/sell/import" variant="secondary">
            Send the file again
          </ButtonLink>
        </div>
      ) : null}
    </div>
  );
}
