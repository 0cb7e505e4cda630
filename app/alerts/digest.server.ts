import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import { mailAlertHits, type AlertHit } from "./alert-mail.server";
import { pruneUnsubscribeTokens } from "./unsubscribe.server";

// The daily digest (a pg-boss schedule runs it once a day, see app/jobs/worker.server.ts): each buyer
// gets one mail with every hit of their alerts not mailed yet, grouped by alert. Each buyer's hits
// are claimed (mailed_at set) before the mail goes, so two runs never send the same hit; a failed
// mail gives them back for the next run.

/** Cron, UTC: the digest goes out at 07:00. */
export const DIGEST_SCHEDULE = "0 7 * * *";

interface Waiting {
  user_id: string;
  email: string;
  display_name: string;
}

export async function sendDigests(now = new Date()): Promise<{ users: number; listings: number }> {
  await pruneUnsubscribeTokens(now);
  const users = await sequelize.query<Waiting>(
    `SELECT DISTINCT u.id AS user_id, u.email, u.display_name
       FROM spec_alert_hits h JOIN spec_alerts a ON a.id = h.alert_id JOIN users u ON u.id = a.user_id
      WHERE h.mailed_at IS NULL AND h.found_at <= :now AND a.frequency <> 'off' AND u.status = 'active'`,
    { replacements: { now }, type: QueryTypes.SELECT },
  );
  let listings = 0;
  let mailed = 0;
  let failure: Error | null = null;
  for (const user of users) {
    const claimed = await sequelize.query<{ alert_id: string; listing_id: string; name: string; query: string }>(
      `UPDATE spec_alert_hits h SET mailed_at = :now FROM spec_alerts a
        WHERE a.id = h.alert_id AND a.user_id = :userId AND a.frequency <> 'off' AND h.mailed_at IS NULL AND h.found_at <= :now
        RETURNING h.alert_id, h.listing_id, a.name, a.query`,
      { replacements: { now, userId: user.user_id }, type: QueryTypes.SELECT },
    );
    // Only units still for sale: one sold or withdrawn since it was found is not worth a line.
    const live = await Listing.findAll({ where: { id: claimed.map((c) => c.listing_id), status: "live" } });
    const byId = new Map(live.map((l) => [l.id, l]));
    const hits: AlertHit[] = claimed.flatMap((c) => {
      const listing = byId.get(c.listing_id);
      return listing ? [{ alertId: c.alert_id, alertName: c.name, query: c.query, listing }] : [];
    });
    if (hits.length === 0) continue;
    hits.sort((a, b) => a.alertName.localeCompare(b.alertName) || a.listing.id.localeCompare(b.listing.id));
    try {
      await mailAlertHits({ id: user.user_id, email: user.email, displayName: user.display_name }, hits, now);
      mailed++;
      listings += hits.length;
    } catch (error) {
      await sequelize.query(
        `UPDATE spec_alert_hits SET mailed_at = NULL
          WHERE mailed_at = :now AND (alert_id, listing_id) IN (SELECT * FROM unnest(CAST(:alerts AS uuid[]), CAST(:listings AS uuid[])))`,
        { replacements: { now, alerts: toArray(claimed.map((c) => c.alert_id)), listings: toArray(claimed.map((c) => c.listing_id)) } },
      );
      failure ??= error instanceof Error ? error : new Error(String(error));
    }
  }
  if (failure) throw failure;
  return { users: mailed, listings };
}

/** A PostgreSQL array literal of uuids (already checked by the database that returned them). */
function toArray(ids: string[]): string {
  return `{${ids.join(",")}}`;
}

export async function digestJob(): Promise<void> {
  await sendDigests(new Date());
}
