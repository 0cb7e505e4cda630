import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/delete";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { redirectWithNotice } from "~/auth/session.server";
import { readPageForm } from "~/http/body.server";
import { ownListing } from "~/listings/access.server";
import { deleteDraft, isDeletable } from "~/listings/delete-draft.server";
import { ListingNotFound, ListingStateError } from "~/listings/errors.server";
import { notFoundPage } from "~/listings/http.server";
import { ListingPhoto } from "~/models/index.server";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { listingTitle } from "@shared/catalogue";

// Deleting a draft: a page of its own that asks once more (a plain form, so it works without
// JavaScript), then the draft and what hangs off it go; a job clears its stored files.

export const meta: Route.MetaFunction = () => [{ title: "Delete a draft · Sell · Loadline" }];

async function own(id: string, sellerId: string) {
  return ownListing(id, sellerId).catch((e: unknown) => (e instanceof ListingNotFound ? notFoundPage() : Promise.reject(e)));
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const listing = await own(params.id, user.id);
  const photos = await ListingPhoto.count({ where: { listingId: listing.id } });
  return { id: listing.id, title: listingTitle(listing.maker, listing.model), deletable: isDeletable(listing), photos };
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  await own(params.id, user.id);
  if (form.get("confirm") !== "yes") return data({ formError: "Press “Delete this draft” to confirm." }, { status: 400 });
  try {
    await deleteDraft(params.id, user.id);
  } catch (e) {
    if (e instanceof ListingNotFound) notFoundPage();
    if (e instanceof ListingStateError) return data({ formError: e.message }, { status: 409 });
    throw e;
  }
  return redirectWithNotice(request, "/sell", "The draft is deleted. Its photos and captures are being removed from storage.");
}

export default function DeleteDraft({ loaderData, actionData }: Route.ComponentProps) {
  const { id, title, deletable, photos } = loaderData;
  const busy = useNavigation().state === "submitting";
  return (
    <main className="mx-auto w-full max-w-2xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader overline="Sell · Delete a draft" title={deletable ? "Delete this draft?" : "This listing cannot be deleted"} />
      <Card className="space-y-4">
        <CardTitle>{title}</CardTitle>
        {deletable ? (
          <>
            <p className="text-ink-soft">
              The draft goes for good: its details, restoration log and bench sheet, its {photos === 1 ? "photo" : `${photos} photos`} in
              every size, and the captures its sheet uses. This cannot be undone.
            </p>
            <Form method="post" className="flex flex-wrap items-center gap-3">
              <FormError>{actionData?.formError}</FormError>
              <Button type="submit" name="confirm" value="yes" variant="danger" busy={busy}>
                Delete this draft
              </Button>
              <Link to={`/sell/${id}/item`} className="inline-flex h-10 items-center px-3 text-sm">
                Keep it
              </Link>
            </Form>
          </>
        ) : (
          <>
            <p className="text-ink-soft">
              Only a draft that was never published can be deleted. A published listing stays as a record; withdraw it from the market
              instead.
            </p>
            <FormError>{actionData?.formError}</FormError>
            <Link to={`/sell/${id}/review`}>Back to the listing</Link>
          </>
        )}
      </Card>
    </main>
  );
}
