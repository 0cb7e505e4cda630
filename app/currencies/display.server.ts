import { createCookie } from "react-router";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { env } from "~/env.server";
import { getUser } from "~/auth/guards.server";
import { countryFromAcceptLanguage } from "~/listings/zones";
import { currencyForCountry, readCurrency, type Rates } from "@shared/currency";
import type { Currency } from "@shared/listing-input";
import { currentRates } from "./rates.server";

// The buyer's display currency: what they chose in this browser (a cookie, a year long; no account
// needed), else what their account keeps (chosen while signed in elsewhere), else a guess from the
// browser's language tags. Prices stay in the seller's currency; this only decides
// which approximate figure appears beside them and what the market's price bounds are typed in.

/** What pages need to show approximate prices. */
export interface Pricing {
  display: Currency;
  rates: Rates;
}

const YEAR_S = 365 * 24 * 3600;
let cookie: ReturnType<typeof createCookie> | undefined;
function currencyCookie() {
  // Not signed: a preference with nothing to forge. Read back through readCurrency either way.
  cookie ??= createCookie("loadline_currency", { path: "/", sameSite: "lax", httpOnly: true, secure: env().secureCookies, maxAge: YEAR_S });
  return cookie;
}

/** The buyer's display currency for this request. The panel's price bounds default to it. */
export async function displayCurrency(request: Request): Promise<Currency> {
  const chosen = readCurrency(await currencyCookie().parse(request.headers.get("Cookie"))) ?? (await accountCurrency(request));
  return chosen ?? currencyForCountry(countryFromAcceptLanguage(request.headers.get("Accept-Language")));
}

async function accountCurrency(request: Request): Promise<Currency | null> {
  const user = await getUser(request);
  if (!user) return null;
  const [row] = await sequelize.query<{ display_currency: string | null }>(`SELECT display_currency FROM users WHERE id = :id`, {
    type: QueryTypes.SELECT,
    replacements: { id: user.id },
  });
  return readCurrency(row?.display_currency);
}

/** Keeps the choice with the account too, when the buyer is signed in. */
export async function keepDisplayCurrency(request: Request, currency: Currency): Promise<void> {
  const user = await getUser(request);
  if (user)
    await sequelize.query(`UPDATE users SET display_currency = :currency WHERE id = :id`, { replacements: { currency, id: user.id } });
}

/**
 * The currency the market's price bounds are typed in: the URL's `currency`; else, when the URL has no
 * price bound, the buyer's display currency; bounds without a currency stay euros (the filters'
 * default), so a shared link means the same to everyone.
 */
export async function marketCurrency(request: Request): Promise<Currency> {
  const params = new URL(request.url).searchParams;
  const named = readCurrency(params.get("currency"));
  if (named) return named;
  if (params.get("priceMin")?.trim() || params.get("priceMax")?.trim()) return "EUR";
  return displayCurrency(request);
}

/** The display currency and the current rates (kept briefly; see currentRates). */
export async function pricingFor(request: Request): Promise<Pricing> {
  const [display, rates] = await Promise.all([displayCurrency(request), currentRates()]);
  return { display, rates };
}

/** The Set-Cookie header that keeps a chosen display currency. */
export function displayCurrencyCookie(currency: Currency): Promise<string> {
  return currencyCookie().serialize(currency);
}
