import { Link } from "react-router";
import type { FormActionState } from "../form-action";

// What the last action did: for a publish, each unit's outcome (live, held and why, or what is still
// missing); for the others, one line; for a refusal, the server's sentence and each unit that stood in
// the way. A live region, so a screen reader hears it when it changes.

export type Report = { from: "form" | "api"; state: FormActionState };

const VERB = {
  withdraw: "withdrawn",
  reprice: "repriced",
  handling: "given the new handling time",
  price: "repriced",
  publish: "published",
} as const;

export function ActionReport({ report, titles }: { report: Report | null; titles: ReadonlyMap<string, string> }) {
  const state = report?.state;
  return (
    <div aria-live="polite" data-testid="action-report">
      {!state ? null : state.ok ? (
        state.result.action === "publish" ? (
          <div className="space-y-2 rounded-md border border-rule bg-card px-4 py-3 text-sm shadow-panel">
            <p className="font-medium">{summary(state.result.outcomes.filter((o) => o.ok).length, state.result.outcomes.length)}</p>
            <ul className="space-y-1">
              {state.result.outcomes.map((o) => (
                <li key={o.id} data-outcome={o.ok ? o.status : "refused"} className="flex gap-2">
                  <span aria-hidden="true" className={o.ok ? (o.status === "live" ? "text-trace" : "text-brass-ink") : "text-fault"}>
                    {o.ok ? (o.status === "live" ? "✓" : "●") : "✕"}
                  </span>
                  <span>
                    <Link to={`/sell/${o.id}/review`} className="font-medium">
                      {o.title}
                    </Link>
                    {" — "}
                    <span className="text-ink-soft">{o.message}</span>
                  </span>
                </li>
              ))}
            </ul>
          </div>
        ) : (
          <p className="rounded-md border border-trace/35 bg-trace-wash px-4 py-3 text-sm text-trace">
            {state.result.outcomes.length === 1 ? state.result.outcomes[0].title : `${state.result.outcomes.length} units`}{" "}
            {state.result.outcomes.length === 1 ? "is" : "are"} {VERB[state.result.action]}.
          </p>
        )
      ) : state.confirm ? null : (
        <div role="alert" className="space-y-1 rounded-md border border-fault/40 bg-fault-wash px-4 py-3 text-sm text-fault">
          <p className="font-medium">{state.formError}</p>
          {state.issues.length > 1 || (state.issues.length === 1 && state.issues[0].message !== state.formError) ? (
            <ul className="list-disc space-y-0.5 pl-5">
              {state.issues.map((i) => (
                <li key={i.path} data-unit={i.path.split(".")[0]}>
                  {i.message.includes(":") || !titles.has(i.path.split(".")[0])
                    ? i.message
                    : `${titles.get(i.path.split(".")[0])}: ${i.message}`}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      )}
    </div>
  );
}

function summary(published: number, total: number): string {
  if (published === total) return total === 1 ? "Published." : `All ${total} units published.`;
  if (published === 0) return total === 1 ? "Not published." : `None of the ${total} units could be published.`;
  return `${published} of ${total} units published; the others say what they still need.`;
}
