import type { ListingHead } from "../types";

/** The unit's particulars: mains setting, weight, boxed size, what comes with it, where it is. */
export function UnitDetails({ listing }: { listing: ListingHead }) {
  const u = listing.unit;
  const place = [listing.place.town, listing.place.region, listing.place.countryName].filter(Boolean).join(", ");
  const rows: [string, React.ReactNode][] = [];
  if (u.mains)
    rows.push([
      "Mains",
      <span key="m" className="figures">
        {u.mains.voltageV} V{u.mains.frequencyHz ? ` ${u.mains.frequencyHz} Hz` : ""}
        <span className="font-sans text-ink-faint">{u.mains.switchable ? ", switchable" : ", fixed"}</span>
      </span>,
    ]);
  if (u.weightText)
    rows.push([
      "Weight",
      <span key="w" className="figures">
        {u.weightText}
      </span>,
    ]);
  if (u.boxedText)
    rows.push([
      "Packed size",
      <span key="b" className="figures">
        {u.boxedText}
      </span>,
    ]);
  rows.push(["Comes with", u.includes.length ? u.includes.join(", ") : "The unit only"]);
  if (place) rows.push(["Located in", place]);
  if (u.serialOnFile) rows.push(["Serial number", "Recorded with Loadline, not shown publicly"]);
  return (
    <section aria-labelledby="unit-heading" className="space-y-3">
      <h2 id="unit-heading" className="text-2xl">
        The unit
      </h2>
      <dl className="divide-y divide-rule/70 rounded-panel border border-rule bg-card text-sm shadow-panel">
        {rows.map(([k, v]) => (
          <div key={k} className="grid grid-cols-[9rem_1fr] gap-3 px-4 py-2.5 max-sm:grid-cols-1 max-sm:gap-0.5">
            <dt className="text-ink-faint">{k}</dt>
            <dd className="text-ink">{v}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
