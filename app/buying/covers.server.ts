import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { mediaUrl } from "~/catalogue/media-url";

// Small cover pictures for the buying pages (checkout, purchases, sales): the marked cover, else
// the first ready photo.

export async function coverThumbs(listingIds: string[]): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  if (!listingIds.length) return out;
  const rows = await sequelize.query<{ listing_id: string; thumb_key: string }>(
    `SELECT DISTINCT ON (listing_id) listing_id, thumb_key FROM listing_photos
      WHERE listing_id IN (:ids) AND status = 'ready' AND thumb_key IS NOT NULL
      ORDER BY listing_id, is_cover DESC, position`,
    { replacements: { ids: [...new Set(listingIds)] }, type: QueryTypes.SELECT },
  );
  for (const r of rows) out.set(r.listing_id, mediaUrl(r.thumb_key));
  return out;
}
