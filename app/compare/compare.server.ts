import { describeConditions, type BenchSheet } from "@shared/bench";
import { compareFigures } from "@shared/bench/figures";
import { CATEGORY_LABELS } from "@shared/catalogue";
import { Listing } from "~/models/index.server";
import { summaryAttributes, summaryIncludeWithSheets, toSummaries } from "~/catalogue/summaries.server";
import { responseSeries } from "~/listings/plot-math";
import { PUBLIC_STATUSES } from "~/listings/visibility";
import { figureGroups } from "./rows";
import type { ResponseSeries } from "~/components/plots";
import type { ComparedUnit, Comparison } from "./types";

// The compare page's data. Only live and sold units are shown, to everyone alike (a seller's own
// draft or a held unit is "no longer available" here too), so an id in a link reveals nothing.

const POINTS_PER_SERIES = 200;

/** Which of these ids are public listings (live or sold), in the order given. */
export async function publicIds(ids: readonly string[]): Promise<string[]> {
  if (!ids.length) return [];
  const rows = await Listing.findAll({ where: { id: [...ids], status: [...PUBLIC_STATUSES] }, attributes: ["id"] });
  const found = new Set(rows.map((r) => r.id));
  return ids.filter((id) => found.has(id));
}

export async function loadComparison(ids: readonly string[]): Promise<Comparison> {
  const rows = ids.length
    ? await Listing.findAll({
        where: { id: [...ids], status: [...PUBLIC_STATUSES] },
        attributes: [...summaryAttributes, "status"],
        include: summaryIncludeWithSheets,
      })
    : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  const ordered = ids.flatMap((id) => byId.get(id) ?? []);
  const summaries = await toSummaries(ordered);
  const sheets = ordered.map((r) => r.benchSheet?.sheet ?? null);

  const units: ComparedUnit[] = summaries.map((s, i) => ({
    ...s,
    status: ordered[i].status === "sold" ? "sold" : "live",
    href: `/listings/${s.id}`,
    categoryLabel: CATEGORY_LABELS[s.category].one,
    shortName: numbered(summaries.map((x) => x.title))[i],
  }));
  const kinds = [...new Set(units.map((u) => u.categoryLabel))];
  return {
    units,
    unavailable: ids.filter((id) => !byId.has(id)),
    mixedKinds: kinds.length > 1 ? kinds : null,
    groups: figureGroups(units.map((u, i) => ({ category: u.category, figures: sheets[i] ? compareFigures(sheets[i]) : [] }))),
    responses: responses(units, sheets),
  };
}

/** "Orrel Five Direct", "Orrel Five Direct (2)": the legend must tell two units of one model apart. */
function numbered(titles: string[]): string[] {
  return titles.map((t, i) => {
    const before = titles.slice(0, i).filter((x) => x === t).length;
    return before ? `${t} (${before + 1})` : t;
  });
}

/**
 * Each unit's first flat sweep as level re 1 kHz, and a phono stage's RIAA sweep as its deviation from
 * the curve (overlaying raw RIAA levels would only show the curve itself). Units with neither are named.
 */
function responses(units: ComparedUnit[], sheets: (BenchSheet | null)[]): Comparison["responses"] {
  const flat: { series: ResponseSeries; swept: string }[] = [];
  const riaa: ResponseSeries[] = [];
  const without: string[] = [];
  units.forEach((u, i) => {
    const sweeps = sheets[i]?.sweeps ?? [];
    const f = sweeps.find((s) => s.kind === "flat");
    const r = sweeps.find((s) => s.kind === "riaa");
    if (f) {
      const points = responseSeries(f, POINTS_PER_SERIES).points.map((p) => ({ hz: p.f, db: p.level }));
      flat.push({
        series: { id: u.id, label: u.shortName, points },
        swept: describeConditions({ ...f.conditions, frequencyRange: undefined }) || "conditions not stated",
      });
    }
    if (r) {
      const points = responseSeries(r, POINTS_PER_SERIES).points.flatMap((p) =>
        p.deviation === undefined ? [] : [{ hz: p.f, db: p.deviation }],
      );
      riaa.push({ id: u.id, label: u.shortName, points });
    }
    if (!f && !r) without.push(u.shortName);
  });
  const same = flat.every((x) => x.swept === flat[0].swept);
  const how = same ? (flat[0]?.swept ?? "") : `— ${flat.map((x) => `${x.series.label}: ${x.swept}`).join("; ")}`;
  return {
    flat: flat.length
      ? { series: flat.map((x) => x.series), conditions: `Level relative to each unit's own 1 kHz level. Swept ${how}.` }
      : null,
    riaa: riaa.length
      ? {
          series: riaa,
          conditions:
            "Each unit's phono playback response less the RIAA curve that fits it best, both relative to 1 kHz: 0 dB is a perfect match.",
        }
      : null,
    without,
  };
}
