// Prints the perceptual hash's distances on every demo photo: each edit against its original, other
// photos of the same unit, and photos of different units (the figures behind docs/decisions/0023).
// Run: npx tsx scripts/photo-hash-distances.ts
import { dctHash, hashDistance, PHOTO_MATCH_MAX_DISTANCE as T } from "../app/photos/perceptual-hash.server";
import { demoPhotoCorpus, PHOTO_EDITS, spread } from "../tests/support/photo-edits";

const corpus = await demoPhotoCorpus();
const hashes = corpus.map((p) => dctHash(p.thumb));
const line = (label: string, xs: number[]) => {
  const { min, median, max } = spread(xs);
  const within = xs.filter((d) => d <= T).length;
  const hist = xs.reduce<Record<number, number>>((m, d) => ((m[d] = (m[d] ?? 0) + 1), m), {});
  console.log(`${label}: ${within} of ${xs.length} within ${T} · min ${min} · median ${median} · max ${max} · ${JSON.stringify(hist)}`);
};
console.log(`${corpus.length} demo photos`);
for (const edit of Object.values(PHOTO_EDITS))
  line(
    edit.label,
    corpus.map((p, i) => hashDistance(hashes[i], dctHash(edit.apply(p.thumb)))),
  );
const same: number[] = [];
const other: { d: number; pair: string }[] = [];
for (let i = 0; i < corpus.length; i++)
  for (let j = i + 1; j < corpus.length; j++) {
    const d = hashDistance(hashes[i], hashes[j]);
    if (corpus[i].serial === corpus[j].serial) same.push(d);
    else other.push({ d, pair: `${corpus[i].serial}/${corpus[i].view} ~ ${corpus[j].serial}/${corpus[j].view}` });
  }
line("other photos of the same unit", same);
line(
  "photos of different units",
  other.map((o) => o.d),
);
console.log(
  "closest different units:",
  other
    .sort((a, b) => a.d - b.d)
    .slice(0, 6)
    .map((o) => `${o.d} ${o.pair}`)
    .join("; "),
);
