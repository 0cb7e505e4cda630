import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/new";
import { requireUser, hasRole } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { createDraft } from "~/listings/drafts.server";
import { ListingInputError } from "~/listings/errors.server";
import { Button } from "~/components/Button";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { CATEGORIES, CATEGORY_LABELS } from "@shared/catalogue";
import { REQUIRED_READINGS, lowerLabel } from "@shared/bench";

export const meta: Route.MetaFunction = () => [{ title: "List a unit · Sell · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { becomesSeller: !hasRole(user, ["seller", "workshop"]) };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  try {
    const listing = await createDraft(user, form.get("category"));
    return redirect(`/sell/${listing.id}/item`);
  } catch (e) {
    if (e instanceof ListingInputError) return data({ error: e.message }, { status: 400 });
    throw e;
  }
}

export default function NewListing({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  return (
    <main className="mx-auto w-full max-w-4xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell · New listing"
        title="What are you listing?"
        lede="The kind of unit decides which readings its bench sheet asks for. Everything else comes step by step, and the draft saves as you go."
      />
      {loaderData.becomesSeller ? (
        <p className="rounded-md border border-rule bg-sunk px-4 py-3 text-sm text-ink-soft">
          Starting a listing adds the <strong className="text-ink">private seller</strong> role to your account. Nothing is public until you
          publish.
        </p>
      ) : null}
      <Form method="post" className="space-y-6">
        <FormError>{actionData?.error}</FormError>
        <fieldset>
          <legend className="sr-only">Kind of unit</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            {CATEGORIES.map((c, i) => (
              <label
                key={c}
                className="flex cursor-pointer gap-3 rounded-panel border border-rule bg-card p-4 shadow-panel transition-colors hover:border-walnut has-[:checked]:border-walnut has-[:checked]:bg-walnut-wash"
              >
                <input
                  type="radio"
                  name="category"
                  value={c}
                  required
                  defaultChecked={i === 0}
                  className="mt-1 size-4 shrink-0 accent-walnut"
                />
                <span className="space-y-1">
                  <span className="block font-serif text-lg font-semibold">{CATEGORY_LABELS[c].one}</span>
                  <span className="block text-sm text-ink-soft">
                    Bench sheet asks for: {REQUIRED_READINGS[c].map((r) => lowerLabel(r.label.replace(/ \(.*\)$/, ""))).join("; ")}.
                  </span>
                </span>
              </label>
            ))}
          </div>
        </fieldset>
        <Button type="submit" size="lg" busy={busy}>
          Start the draft
        </Button>
      </Form>
    </main>
  );
}
