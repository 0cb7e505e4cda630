import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import type { SessionUser } from "~/auth/guards.server";
import { rateMillionths, type Rates } from "@shared/currency";
import { isBigChange, type RateChange } from "./rate-form";

// The admin's exchange-rate table. Pages read it on every request (the approximate prices), so it
// is kept here for a short while; a change through saveRates forgets it at once in this process, and
// other processes pick it up within RATES_CACHE_MS.

export const RATES_CACHE_MS = 30_000;
let cached: { at: number; rates: Promise<Rates> } | null = null;

/** The current rates as pages receive them (currency → per euro, minor digits). */
export function currentRates(now = Date.now()): Promise<Rates> {
  if (!cached || now - cached.at > RATES_CACHE_MS) {
    const rates = readRates();
    cached = { at: now, rates };
    // A failed read is not kept.
    rates.catch(() => {
      if (cached?.rates === rates) cached = null;
    });
  }
  return cached.rates;
}

export function forgetRates(): void {
  cached = null;
}

async function readRates(): Promise<Rates> {
  const rows = await sequelize.query<{ currency: string; per_eur: string; minor_digits: number }>(
    "SELECT currency, per_eur::text AS per_eur, minor_digits FROM currency_rates ORDER BY currency",
    { type: QueryTypes.SELECT },
  );
  const rates: Rates = {};
  for (const r of rows) rates[r.currency] = { perEur: r.per_eur, minorDigits: r.minor_digits };
  return rates;
}

export interface RateRow {
  currency: string;
  perEur: string;
  minorDigits: number;
  updatedAt: string;
  updatedBy: string | null;
}

/** The table as the admin page shows it: the euro first, then by code. */
export async function rateTable(): Promise<RateRow[]> {
  const rows = await sequelize.query<{ currency: string; per_eur: string; minor_digits: number; updated_at: Date; name: string | null }>(
    `SELECT r.currency, r.per_eur::text AS per_eur, r.minor_digits, r.updated_at, u.display_name AS name
       FROM currency_rates r LEFT JOIN users u ON u.id = r.updated_by
      ORDER BY r.currency <> 'EUR', r.currency`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    currency: r.currency,
    perEur: trimRate(r.per_eur),
    minorDigits: r.minor_digits,
    updatedAt: new Date(r.updated_at).toISOString(),
    updatedBy: r.name,
  }));
}

export interface RateChangeLine {
  id: string;
  currency: string;
  oldPerEur: string;
  newPerEur: string;
  changedBy: string;
  changedAt: string;
}

export async function recentRateChanges(limit = 20): Promise<RateChangeLine[]> {
  const rows = await sequelize.query<{
    id: string;
    currency: string;
    old_per_eur: string;
    new_per_eur: string;
    changed_by_name: string;
    changed_at: Date;
  }>(
    `SELECT id::text AS id, currency, old_per_eur::text AS old_per_eur, new_per_eur::text AS new_per_eur, changed_by_name, changed_at
       FROM currency_rate_changes ORDER BY changed_at DESC, id DESC LIMIT :limit`,
    { type: QueryTypes.SELECT, replacements: { limit } },
  );
  return rows.map((r) => ({
    id: r.id,
    currency: r.currency,
    oldPerEur: trimRate(r.old_per_eur),
    newPerEur: trimRate(r.new_per_eur),
    changedBy: r.changed_by_name,
    changedAt: new Date(r.changed_at).toISOString(),
  }));
}

/** "0.860000" → "0.86" (numeric keeps the scale it was written with). */
export function trimRate(text: string): string {
  return text.includes(".") ? text.replace(/0+$/, "").replace(/\.$/, "") : text;
}

export type SaveRatesResult =
  | { ok: true; saved: RateChange[]; repriced: number }
  | { ok: false; confirm: (RateChange & { from: string })[] }
  | { ok: false; unknown: string[] };

/**
 * Saves the changed rates in one transaction, each with its audit line; the database's triggers
 * re-price the listings in those currencies within it. A change of more than a fifth against the
 * stored rate (read under lock) is saved only when `confirmed`.
 */
export async function saveRates(
  actor: SessionUser,
  changes: RateChange[],
  { confirmed }: { confirmed: boolean },
): Promise<SaveRatesResult> {
  const result = await sequelize.transaction(async (transaction): Promise<SaveRatesResult> => {
    const current = await lockRates(
      changes.map((c) => c.currency),
      transaction,
    );
    const unknown = changes.filter((c) => !current.has(c.currency)).map((c) => c.currency);
    if (unknown.length) return { ok: false, unknown };
    const real = changes.filter((c) => rateMillionths(c.perEur) !== rateMillionths(current.get(c.currency)!));
    const big = real.filter((c) => isBigChange(current.get(c.currency)!, c.perEur));
    if (big.length && !confirmed) return { ok: false, confirm: big.map((c) => ({ ...c, from: trimRate(current.get(c.currency)!) })) };
    for (const c of real) {
      await sequelize.query(
        `UPDATE currency_rates SET per_eur = :perEur, updated_at = now(), updated_by = :actor WHERE currency = :currency`,
        { replacements: { perEur: c.perEur, actor: actor.id, currency: c.currency }, transaction },
      );
      await sequelize.query(
        `INSERT INTO currency_rate_changes (currency, old_per_eur, new_per_eur, changed_by, changed_by_name)
         VALUES (:currency, :old, :perEur, :actor, :name)`,
        {
          replacements: { currency: c.currency, old: current.get(c.currency)!, perEur: c.perEur, actor: actor.id, name: actor.displayName },
          transaction,
        },
      );
    }
    const [{ n }] = real.length
      ? await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM listings WHERE currency IN (:codes)`, {
          type: QueryTypes.SELECT,
          replacements: { codes: real.map((c) => c.currency) },
          transaction,
        })
      : [{ n: "0" }];
    return { ok: true, saved: real, repriced: Number(n) };
  });
  if (result.ok && result.saved.length) forgetRates();
  return result;
}

async function lockRates(codes: string[], transaction: Transaction): Promise<Map<string, string>> {
  if (!codes.length) return new Map();
  const rows = await sequelize.query<{ currency: string; per_eur: string }>(
    `SELECT currency, per_eur::text AS per_eur FROM currency_rates WHERE currency IN (:codes) ORDER BY currency FOR UPDATE`,
    { type: QueryTypes.SELECT, replacements: { codes }, transaction },
  );
  return new Map(rows.map((r) => [r.currency, r.per_eur]));
}
