import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { currentRates } from "~/currencies/rates.server";
import { convertMinor, type Rates } from "@shared/currency";
import { indexFigures, indexKey, type IndexFigures, type Sale } from "@shared/price-index";

// The sold-price index: what units of one maker and model sold for on Loadline, from orders whose
// money was released to the seller in whole. A sale with a part refund is left out: its price is
// what a dispute settled on, not what the unit was worth (docs/decisions/0024). Sales in another
// currency are converted with the admin's current rates, so the figures read in the listing's own.

export interface SoldPriceIndex extends IndexFigures {
  currency: string;
}

/** Keys as SQL computes them; the expression matches the index listings_maker_model_key. */
const KEY = (column: string) => `lower(regexp_replace(btrim(${column}), '\\s+', ' ', 'g'))`;

interface SaleRow {
  price_minor: number;
  currency: string;
  bench_verified: boolean;
}

/** Every completed sale of this maker and model (in its own currency), oldest first. */
export async function salesOf(maker: string, model: string, transaction?: Transaction): Promise<SaleRow[]> {
  if (!indexKey(maker) || !indexKey(model)) return [];
  return sequelize.query<SaleRow>(
    `SELECT o.price_minor, o.currency, l.bench_verified
       FROM listings l JOIN orders o ON o.listing_id = l.id
      WHERE ${KEY("l.maker")} = :maker AND ${KEY("l.model")} = :model
        AND o.state = 'released' AND o.refunded_minor = 0 AND o.released_at IS NOT NULL
      ORDER BY o.released_at`,
    { replacements: { maker: indexKey(maker), model: indexKey(model) }, type: QueryTypes.SELECT, transaction },
  );
}

/** The sales in `currency` (converted where they were made in another; one without a rate is left out). */
export function inCurrency(rows: readonly SaleRow[], currency: string, rates: Rates): Sale[] {
  const out: Sale[] = [];
  for (const r of rows) {
    const price = r.currency === currency ? r.price_minor : convertMinor(r.price_minor, r.currency, currency, rates);
    if (price !== null) out.push({ priceMinor: price, benchVerified: r.bench_verified });
  }
  return out;
}

/** The index for a maker and model in `currency`; null when there are too few sales to show one. */
export async function soldPriceIndex(
  maker: string | null,
  model: string | null,
  currency: string,
  transaction?: Transaction,
): Promise<SoldPriceIndex | null> {
  if (!maker || !model) return null;
  const rows = await salesOf(maker, model, transaction);
  if (rows.length === 0) return null;
  const needRates = rows.some((r) => r.currency !== currency);
  const figures = indexFigures(inCurrency(rows, currency, needRates ? await currentRates() : {}));
  return figures ? { ...figures, currency } : null;
}
