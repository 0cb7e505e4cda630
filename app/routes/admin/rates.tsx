import { data } from "react-router";
import type { Route } from "./+types/rates";
import { AdminNav } from "~/components/AdminNav";
import { PageHeader } from "~/components/PageHeader";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { rateTable, recentRateChanges, saveRates } from "~/currencies/rates.server";
import { readRateForm } from "~/currencies/rate-form";
import { RatesForm, RateChanges, type RatesActionData } from "~/currencies/RatesForm";

export const meta: Route.MetaFunction = () => [{ title: "Exchange rates · Admin · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireRole(request, "admin");
  const [rates, changes] = await Promise.all([rateTable(), recentRateChanges()]);
  return data({ rates, changes }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const admin = await requireRole(request, "admin");
  const form = await readPageForm(request);
  // What was typed goes back into the fields when nothing is saved.
  const values: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (k.startsWith("rate.") && typeof v === "string") values[k] = v.slice(0, 40);
  const read = readRateForm(form);
  if (!read.ok) return data<RatesActionData>({ kind: "invalid", errors: read.errors, values }, { status: 400 });
  const saved = await saveRates(admin, read.changes, { confirmed: read.confirmed });
  if (!saved.ok) {
    if ("confirm" in saved) return data<RatesActionData>({ kind: "confirm", confirm: saved.confirm, values }, { status: 409 });
    const errors = Object.fromEntries(saved.unknown.map((c) => [c, "This currency has no row in the rate table."]));
    return data<RatesActionData>({ kind: "invalid", errors, values }, { status: 400 });
  }
  return data<RatesActionData>({ kind: "saved", saved: saved.saved, repriced: saved.repriced });
}

export default function AdminRates({ loaderData, actionData }: Route.ComponentProps) {
  const { rates, changes } = loaderData;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-10">
      <PageHeader
        overline="Admin"
        title="Exchange rates"
        lede="Prices stay in the seller's currency. These rates give buyers an approximate figure in their own and let the market filter and sort by price across currencies."
        actions={<AdminNav />}
      />
      <RatesForm rates={rates} result={actionData ?? null} />
      <RateChanges changes={changes} />
    </main>
  );
}
