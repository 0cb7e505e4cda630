import { parseDecimal, parseWhole } from "@shared/listing-input";
import { isOneOf } from "@shared/one-of";
import type { InventoryAction, InventoryActionResult } from "@shared/inventory";

// The bulk bar's form read into an action: the same form is posted plainly without JavaScript (the
// /sell action reads it here) and read in the browser before the JSON call. The server validates the
// action again with its zod schema; this only turns the form's text into the action's shape.

export type FormActionState =
  | { ok: true; result: InventoryActionResult }
  | {
      ok: false;
      formError: string;
      issues: { path: string; message: string }[];
      ids: string[];
      intent: string;
      /** A withdrawal waits for "Yes, withdraw": the page asks again with the same selection. */
      confirm?: boolean;
    };

const INTENTS = ["publish", "withdraw", "reprice", "handling"] as const;

type FormLike = { get(name: string): unknown; getAll(name: string): unknown[] };
const str = (form: FormLike, name: string) => {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
};

/** A percentage as typed: "-10", "−10 %", "+12,5". */
export function parsePercent(text: string): number | null {
  const t = text.trim().replace(/\s*%$/, "").replace(/^−/, "-").replace(/\s/g, "");
  const m = /^([+-]?)(.*)$/.exec(t);
  const n = m ? parseDecimal(m[2]) : null;
  if (n === null || !m) return null;
  return m[1] === "-" ? -n : n;
}

export function formAction(form: FormLike): { ok: true; action: InventoryAction } | { ok: false; state: FormActionState } {
  const intent = str(form, "intent");
  const ids = form.getAll("ids").filter((v): v is string => typeof v === "string");
  const fail = (formError: string, extra: { confirm?: boolean } = {}) => ({
    ok: false as const,
    state: { ok: false as const, formError, issues: [], ids, intent, ...extra },
  });
  if (!isOneOf(INTENTS, intent)) return fail("Choose what to do with the selected units.");
  if (!ids.length) return fail("Select at least one unit first.");
  const many = ids.length === 1 ? "the unit" : `${ids.length} units`;
  switch (intent) {
    case "publish":
      return { ok: true, action: { action: "publish", ids } };
    case "withdraw":
      if (str(form, "confirm") !== "yes")
        return fail(`Confirm that you want to withdraw ${many}: ${ids.length === 1 ? "it leaves" : "they leave"} the market at once.`, {
          confirm: true,
        });
      return { ok: true, action: { action: "withdraw", ids } };
    case "reprice": {
      const percent = parsePercent(str(form, "percent"));
      if (percent === null) return fail("Give the change as a percentage, e.g. -10 for 10 % less or 5 for 5 % more.");
      return { ok: true, action: { action: "reprice", ids, percent } };
    }
    case "handling": {
      const days = parseWhole(str(form, "handlingDays"), 0, 30, "the handling time in days");
      if (!days.ok) return fail(days.message);
      if (days.value === null) return fail("Give the handling time in days, 0 to 30.");
      return { ok: true, action: { action: "handling", ids, handlingDays: days.value } };
    }
  }
}
