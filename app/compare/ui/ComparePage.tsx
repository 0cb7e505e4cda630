import { Form, Link } from "react-router";
import { ButtonLink, buttonClass } from "~/components/Button";
import { PageHeader } from "~/components/PageHeader";
import { MAX_COMPARED } from "../selection";
import type { Comparison } from "../types";
import { CompareTable } from "./CompareTable";
import { ResponseOverlay } from "./ResponseOverlay";

const note = "rounded-panel border px-4 py-3 text-sm";

export function ComparePage({
  problem,
  comparison,
  list,
  refusal,
}: {
  problem: { message: string; first: string | null } | null;
  comparison: Comparison | null;
  list: string[];
  refusal: string | null;
}) {
  const units = comparison?.units ?? [];
  return (
    <main className="mx-auto w-full max-w-6xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Compare"
        title="Side by side"
        lede={
          <>
            Only measured figures are compared: what each unit measured on the bench, with the conditions beside every number. Makers' rated
            figures are left out. Where the conditions match, the stronger figure in each row is marked.
          </>
        }
        actions={list.length ? <ClearList /> : null}
      />

      {refusal ? (
        <p role="alert" className={`${note} border-fault/40 bg-fault-wash text-fault`}>
          {refusal}
        </p>
      ) : null}

      {problem ? (
        <div role="alert" className={`${note} space-y-2 border-fault/40 bg-fault-wash text-ink`}>
          <p className="font-medium text-fault">{problem.message}</p>
          <p className="flex flex-wrap gap-x-4 gap-y-1">
            {problem.first ? (
              <Link to={problem.first} className="font-medium text-walnut underline underline-offset-2">
                Compare the first {MAX_COMPARED}
              </Link>
            ) : null}
            <Link to="/market" className="font-medium text-walnut underline underline-offset-2">
              Back to the market
            </Link>
          </p>
        </div>
      ) : null}

      {comparison?.unavailable.length ? <Unavailable ids={comparison.unavailable} list={list} /> : null}

      {units.length ? (
        <>
          {comparison!.mixedKinds ? (
            <p role="note" className={`${note} border-brass/50 bg-brass-wash text-ink`}>
              <span className="font-semibold">Different kinds of unit: {comparison!.mixedKinds.join(", ")}.</span> Their figures are shown
              side by side, but one is only marked stronger than another of the same kind (amplifiers of every sort count as one kind).
            </p>
          ) : null}
          <CompareTable units={units} groups={comparison!.groups} />
          {comparison!.groups.length === 0 ? (
            <p className="text-sm text-ink-soft">None of these units has measured figures on a bench sheet yet.</p>
          ) : null}
          {units.length < MAX_COMPARED ? (
            <p className="text-sm text-ink-soft">
              {units.length === 1 ? "Add another unit to set them side by side: " : `Room for ${MAX_COMPARED - units.length} more: `}
              use <span className="font-medium text-ink">Compare</span> on a unit in the{" "}
              <Link to="/market" className="text-walnut underline underline-offset-2">
                market
              </Link>{" "}
              or on its page.
            </p>
          ) : null}
          <ResponseOverlay responses={comparison!.responses} />
        </>
      ) : !problem ? (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">Nothing to compare yet</h2>
          <p className="mx-auto mt-2 max-w-md text-ink-soft">
            Press <span className="font-medium text-ink">Compare</span> on up to {MAX_COMPARED} units in the market or on their pages, and
            they appear here side by side.
          </p>
          <ButtonLink to="/market" className="mt-5">
            Browse the market
          </ButtonLink>
        </div>
      ) : null}
    </main>
  );
}

function ClearList() {
  return (
    <Form method="post" action="/compare">
      <input type="hidden" name="intent" value="clear" />
      <input type="hidden" name="returnTo" value="/compare" />
      <button type="submit" className={buttonClass("secondary", "sm")}>
        Clear your compare list
      </button>
    </Form>
  );
}

/** Ids that are not shown: never said why (sold on elsewhere, withdrawn, held, a draft or no such unit). */
function Unavailable({ ids, list }: { ids: string[]; list: string[] }) {
  const n = ids.length;
  const mine = ids.filter((id) => list.includes(id));
  return (
    <div role="status" className={`${note} space-y-2 border-rule-strong bg-card text-ink-soft`}>
      <p>
        <span className="font-semibold text-ink">
          {n === 1 ? "One unit" : `${n} units`} in this comparison {n === 1 ? "is" : "are"} no longer available.
        </span>{" "}
        {n === 1 ? "It is" : "They are"} not in the market any more, so {n === 1 ? "it is" : "they are"} left out.
      </p>
      {mine.length ? (
        <div className="flex flex-wrap gap-2">
          {mine.map((id, i) => (
            <Form key={id} method="post" action="/compare">
              <input type="hidden" name="intent" value="remove" />
              <input type="hidden" name="listingId" value={id} />
              <input type="hidden" name="returnTo" value="/compare" />
              <button type="submit" className={buttonClass("secondary", "sm")}>
                Take {mine.length === 1 ? "it" : `unit ${i + 1}`} off your compare list
              </button>
            </Form>
          ))}
        </div>
      ) : null}
    </div>
  );
}
