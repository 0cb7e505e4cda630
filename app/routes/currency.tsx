import { data, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/currency";
import { assertSameOrigin } from "~/auth/csrf.server";
import { safeRedirect } from "~/auth/redirect";
import { displayCurrencyCookie, keepDisplayCurrency } from "~/currencies/display.server";
import { readPageForm } from "~/http/body.server";
import { methodNotAllowed } from "~/http/errors.server";
import { CURRENCY_CODES } from "@shared/listing-input";

// The footer's display-currency form posts here: keep the choice in a cookie (and with the account, when
// signed in), go back where the buyer was.

const CurrencyForm = z.object({
  currency: z.enum(CURRENCY_CODES, { message: `Choose one of ${CURRENCY_CODES.join(", ")}.` }),
  returnTo: z.string().max(2048).optional(),
});

export function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed(["POST"]);
  assertSameOrigin(request);
  const parsed = CurrencyForm.safeParse(Object.fromEntries(await readPageForm(request)));
  if (!parsed.success) throw data({ message: parsed.error.issues[0].message }, { status: 400, statusText: "Bad Request" });
  await keepDisplayCurrency(request, parsed.data.currency);
  return redirect(safeRedirect(parsed.data.returnTo, "/"), {
    headers: { "Set-Cookie": await displayCurrencyCookie(parsed.data.currency) },
  });
}
