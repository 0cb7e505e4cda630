import { useState, type FormEvent } from "react";
import { useSearchParams } from "react-router";
import { inventoryParams, readInventoryQuery, type InventoryAction, type InventoryPage } from "@shared/inventory";
import { ButtonLink, buttonClass } from "~/components/Button";
import { PageHeader } from "~/components/PageHeader";
import { Pagination } from "~/components/Pagination";
import { formAction, type FormActionState } from "../form-action";
import { BulkBar } from "./BulkBar";
import { Filters } from "./Filters";
import { InventoryTable } from "./InventoryTable";
import { ActionReport, type Report } from "./ActionReport";
import { useInventoryAction, useInventoryPage } from "./use-inventory";

// The workshop's inventory page: filters, the bulk bar and the table in one plain POST form (so it
// works without JavaScript), pages as links. With JavaScript the form's submit is read here and sent
// to the JSON API through react-query; the table changes at once and goes back if the server refuses.

export function InventoryView({
  first,
  actionData,
}: {
  /** `workshop`: the bulk import and restoration templates are offered (workshops only). */
  first: { page: InventoryPage; params: string; workshop?: boolean };
  actionData: FormActionState | null;
}) {
  const [searchParams] = useSearchParams();
  const query = readInventoryQuery(searchParams);
  const params = inventoryParams(query).toString();
  const pageQuery = useInventoryPage(params, first);
  const page = pageQuery.data ?? first.page;

  const [selected, setSelected] = useState<Set<string>>(() => new Set(actionData && !actionData.ok ? actionData.ids : []));
  const [confirming, setConfirming] = useState(!!(actionData && !actionData.ok && actionData.confirm));
  const [report, setReport] = useState<Report | null>(actionData ? { from: "form", state: actionData } : null);
  const [priceErrors, setPriceErrors] = useState<Map<string, string>>(new Map());
  const mutation = useInventoryAction(params, (result) => {
    setReport({ from: "api", state: { ok: true, result } });
    if (result.action !== "price") setSelected(new Set());
  });
  const savingIds = new Set(mutation.isPending && mutation.variables?.action === "price" ? mutation.variables.ids : []);

  const run = (action: InventoryAction) => {
    setConfirming(false);
    if (action.action === "price") setPriceErrors((m) => new Map([...m].filter(([id]) => id !== action.ids[0])));
    else setReport(null);
    mutation.mutate(action, {
      onError: (error) => {
        if (action.action === "price") setPriceErrors((m) => new Map(m).set(action.ids[0], error.message));
        else
          setReport({
            from: "api",
            state: { ok: false, formError: error.message, issues: error.issues, ids: action.ids, intent: action.action },
          });
      },
    });
  };

  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const native = e.nativeEvent as SubmitEvent; // React's FormEvent does not carry the submitter
    const form = new FormData(e.currentTarget, native.submitter);
    const read = formAction(form);
    if (read.ok) return run(read.action);
    if (read.state.ok === false && read.state.confirm) return setConfirming(true);
    setReport({ from: "api", state: read.state });
  };

  const titles = new Map(page.rows.map((r) => [r.id, r.title]));
  const empty = Object.values(page.stateCounts).every((n) => n === 0);
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell"
        title="Inventory"
        lede="Every unit you list, in every state. Tick units to publish, withdraw, or change their price or handling time together."
        actions={
          <>
            {empty ? null : (
              <a href={`/sell/inventory.csv${params ? `?${params}` : ""}`} download className={buttonClass("secondary")}>
                Export CSV
              </a>
            )}
            {first.workshop ? (
              <>
                <ButtonLink to="/sell/import" variant="secondary">
                  Import CSV
                </ButtonLink>
                <ButtonLink to="/sell/templates" variant="secondary">
                  Templates
                </ButtonLink>
              </>
            ) : null}
            <ButtonLink to="/sell/new">List a unit</ButtonLink>
          </>
        }
      />
      {empty ? (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">Nothing listed yet</h2>
          <p className="mx-auto mt-2 max-w-md text-ink-soft">
            Start with the kind of unit. You fill in the details, condition, restoration log, photos and bench sheet at your own pace;
            nothing is public until you publish.
          </p>
          <ButtonLink to="/sell/new" className="mt-5">
            List your first unit
          </ButtonLink>
        </div>
      ) : (
        <>
          <Filters key={params} query={query} stateCounts={page.stateCounts} />
          <form method="post" onSubmit={onSubmit} className="space-y-3" aria-busy={pageQuery.isPlaceholderData || undefined}>
            <BulkBar
              key={confirming ? "confirm" : "bar"}
              count={selected.size}
              busy={mutation.isPending && mutation.variables?.action !== "price"}
              confirming={confirming}
              onCancelConfirm={() => setConfirming(false)}
              initialIntent={report?.state.ok === false ? report.state.intent : undefined}
            />
            <ActionReport report={report} titles={titles} />
            {page.rows.length ? (
              <InventoryTable
                rows={page.rows}
                query={query}
                selected={selected}
                onToggle={(id, on) =>
                  setSelected((s) => {
                    const next = new Set(s);
                    if (on) next.add(id);
                    else next.delete(id);
                    return next;
                  })
                }
                onToggleAll={(on) => setSelected(on ? new Set(page.rows.map((r) => r.id)) : new Set())}
                onSave={run}
                priceErrors={priceErrors}
                savingIds={savingIds}
              />
            ) : (
              <p className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-8 text-center text-ink-soft">
                No unit of yours fits these filters.
              </p>
            )}
          </form>
          <Pagination
            page={page.page}
            pageCount={page.pageCount}
            hrefFor={(n) => `?${inventoryParams({ ...query, page: n })}`}
            labels={{ previous: "← Previous", next: "Next →" }}
            className="pt-2"
          />
          <p className="text-sm text-ink-faint">
            <span className="figures">{page.total}</span> {page.total === 1 ? "unit" : "units"} fit these filters. The export writes them
            all, in the layout of the bulk import.
          </p>
        </>
      )}
    </main>
  );
}
