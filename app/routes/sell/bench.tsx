import { data, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/bench";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { ownListing } from "~/listings/access.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { ListingInputError, ListingNotFound } from "~/listings/errors.server";
import { notFoundPage, stepFailure } from "~/listings/http.server";
import { BenchSheetEditor } from "~/sell/bench/BenchSheetEditor";
import { plotsForDraft } from "~/listings/plots.server";
import { Plots } from "~/listings/ui/Plots";
import { useEditor } from "./editor";
import { HttpError } from "~/http/errors.server";
import { addCaptureToSheet, postCaptureForm, postedCapture } from "~/listings/capture-post.server";
import { CAPTURE_KINDS } from "~/sell/bench/capture-kinds";
import { isOneOf } from "@shared/one-of";
import { readSheetForm, readSheetState, sheetToState, type SheetFormState } from "@shared/bench-form/state";

// The bench sheet step. Without JavaScript the whole form posts here and the server reads it the same
// way the browser does; with it, the sheet autosaves through the listing API and outcomes update live.

// The saved sheet's capture plots; autosave goes through a fetcher, so they refresh after each save.
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const plots = await plotsForDraft(params.id, user.id).catch((e: unknown) =>
    e instanceof ListingNotFound ? notFoundPage() : Promise.reject(e),
  );
  // After a plain-form capture upload: that capture's outcome (`?capture=`), and the kind chosen (`?kind=`).
  const url = new URL(request.url);
  const posted = await postedCapture(params.id, user.id, url.searchParams.get("capture"));
  const kind = url.searchParams.get("kind");
  return { plots, posted, captureKind: isOneOf(CAPTURE_KINDS, kind) ? kind : null };
}

type Failure = { ok: false; state: SheetFormState; formError?: string; issues: string[] };
type CaptureFailure = { ok: false; capture: { message: string; issues: string[] } };

/** The capture form without JavaScript: multipart, so it never mixes with the sheet's own form. */
async function captureAction(request: Request, listingId: string, userId: string) {
  try {
    const { captureId } = await postCaptureForm(request, listingId, userId);
    return redirect(`/sell/${listingId}/bench?capture=${captureId}#captures`);
  } catch (e) {
    if (e instanceof ListingNotFound) notFoundPage();
    if (e instanceof HttpError)
      return data<CaptureFailure>(
        { ok: false, capture: { message: e.message, issues: (e.issues ?? []).map((i) => i.message) } },
        { status: e.status, headers: e.headers },
      );
    throw e;
  }
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  if (request.headers.get("Content-Type")?.toLowerCase().startsWith("multipart/form-data"))
    return captureAction(request, params.id, user.id);
  const listing = await ownListing(params.id, user.id).catch((e: unknown) =>
    e instanceof ListingNotFound ? notFoundPage() : Promise.reject(e),
  );
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.benchForm });
  if (form.get("intent") === "add-capture") {
    await addCaptureToSheet(params.id, user.id, form.get("captureId"));
    return redirect(`/sell/${params.id}/bench?capture=${encodeURIComponent(String(form.get("captureId") ?? ""))}#captures`);
  }
  const state = readSheetForm(form, listing.category);
  const read = readSheetState(state);
  if (!read.sheet)
    return data<Failure>(
      {
        ok: false,
        state,
        formError: `The sheet was not saved: ${read.errorCount} field${read.errorCount === 1 ? " needs" : "s need"} attention.`,
        issues: [],
      },
      { status: 400 },
    );
  try {
    const saved = await saveBenchSheet(params.id, user.id, read.sheet);
    if (form.get("intent") === "next") return redirect(`/sell/${params.id}/review`);
    const lost = saved.wasVerified && !saved.listing.benchVerified;
    return { ok: true as const, notice: lost ? "Saved. The changed sheet no longer earns the bench-verified mark." : "Saved and checked." };
  } catch (e) {
    if (e instanceof ListingInputError)
      return data<Failure>(
        { ok: false, state, formError: "The sheet was not saved.", issues: e.issues.map((i) => `${i.path}: ${i.message}`) },
        { status: 400 },
      );
    const failure = stepFailure(e);
    return data<Failure>({ ok: false, state, formError: failure.ok ? undefined : failure.formError, issues: [] }, { status: 409 });
  }
}

export default function BenchStep({ actionData, loaderData }: Route.ComponentProps) {
  const { listing, sheet } = useEditor();
  const busy = useNavigation().state === "submitting";
  const failed = actionData && !actionData.ok && "state" in actionData ? actionData : null;
  const captureFailure = actionData && !actionData.ok && "capture" in actionData ? actionData.capture : null;
  const initial: SheetFormState = failed?.state ?? sheetToState(sheet, listing.category);
  return (
    <>
      <BenchSheetEditor
        listingId={listing.id}
        initial={initial}
        published={listing.status === "live" || listing.status === "held"}
        serverErrors={failed?.issues}
        formError={failed?.formError}
        busy={busy}
        notice={actionData?.ok ? actionData.notice : undefined}
        capture={{ posted: loaderData.posted, failure: captureFailure, kind: loaderData.captureKind }}
      />
      <Plots
        plots={loaderData.plots}
        heading="Your captures, plotted"
        lede="Drawn from the captures on the saved sheet, as buyers will see them once the listing is published."
      />
    </>
  );
}
