import { QueryTypes, type Transaction } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { idSchema } from "@shared/ids";
import { listingsMatchingQuery } from "./filters.server";
import { mailAlertHits, type AlertHit } from "./alert-mail.server";

// Spec alerts meet new listings: publishing (or, later, the desk clearing a held unit) queues one
// match job in its transaction. The job asks the market's own query which alerts the listing
// matches, records each pair once (the primary key: a listing is never sent twice for one alert),
// and mails "at once" alerts straight away; daily ones wait for the digest (digest.server.ts).

export const AlertMatchJob = z.object({ listingId: idSchema("listing") });

/** Called where a listing goes live: publishing today, the desk's clearing of a held unit later. */
export function queueAlertMatching(listingId: string, transaction: Transaction): Promise<string> {
  return enqueue(QUEUES.alertMatch, { listingId }, { transaction });
}

interface Candidate {
  id: string;
  user_id: string;
  name: string;
  query: string;
  frequency: "instant" | "daily";
  email: string;
  display_name: string;
}

export async function matchSpecAlerts(data: unknown, _jobId?: string, now = new Date()): Promise<{ matched: number; mailed: number }> {
  const { listingId } = AlertMatchJob.parse(data);
  const listing = await Listing.findByPk(listingId);
  if (!listing || listing.status !== "live") return { matched: 0, mailed: 0 };
  // Never the seller's own alerts, never an alert that already has this listing.
  const candidates = await sequelize.query<Candidate>(
    `SELECT a.id, a.user_id, a.name, a.query, a.frequency, u.email, u.display_name
       FROM spec_alerts a JOIN users u ON u.id = a.user_id
      WHERE a.frequency <> 'off' AND a.user_id <> :sellerId AND u.status = 'active'
        AND NOT EXISTS (SELECT 1 FROM spec_alert_hits h WHERE h.alert_id = a.id AND h.listing_id = :listingId)
      ORDER BY a.created_at`,
    { replacements: { sellerId: listing.sellerId, listingId }, type: QueryTypes.SELECT },
  );
  // Alerts saved with the same filters share one query.
  const byQuery = new Map<string, Candidate[]>();
  for (const c of candidates) byQuery.set(c.query, [...(byQuery.get(c.query) ?? []), c]);
  const matched: Candidate[] = [];
  for (const [query, alerts] of byQuery) {
    if ((await listingsMatchingQuery(query, [listingId])).includes(listingId)) matched.push(...alerts);
  }
  let mailed = 0;
  let failure: Error | null = null;
  for (const alert of matched) {
    const [inserted] = await sequelize.query<{ alert_id: string }>(
      `INSERT INTO spec_alert_hits (alert_id, listing_id, found_at) VALUES (:alertId, :listingId, :now)
       ON CONFLICT DO NOTHING RETURNING alert_id`,
      { replacements: { alertId: alert.id, listingId, now }, type: QueryTypes.SELECT },
    );
    if (!inserted || alert.frequency !== "instant") continue;
    const hit: AlertHit = { alertId: alert.id, alertName: alert.name, query: alert.query, listing };
    try {
      await mailAlertHits({ id: alert.user_id, email: alert.email, displayName: alert.display_name }, [hit], now);
      await sequelize.query(`UPDATE spec_alert_hits SET mailed_at = :now WHERE alert_id = :alertId AND listing_id = :listingId`, {
        replacements: { now, alertId: alert.id, listingId },
      });
      mailed++;
    } catch (error) {
      // Forget the hit so pg-boss's retry finds and mails it again.
      await sequelize.query(`DELETE FROM spec_alert_hits WHERE alert_id = :alertId AND listing_id = :listingId`, {
        replacements: { alertId: alert.id, listingId },
      });
      failure ??= error instanceof Error ? error : new Error(String(error));
    }
  }
  if (failure) throw failure;
  return { matched: matched.length, mailed };
}
