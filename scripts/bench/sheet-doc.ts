// Writes the "Check a bench sheet" section of docs/api.md from the code itself: the quantity and rule tables,
// and the example request with the response the check actually gives. Run: `npx tsx scripts/bench/sheet-doc.ts`.
// Only that section is replaced (up to the next "## " heading); the rest of the file is left as it is.
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { checkBenchSheetJson } from "../../shared/bench/api";
import { exampleIntegratedAmplifierRequest } from "../../shared/bench/examples";
import { CATEGORIES, CATEGORY_QUANTITIES, QUANTITIES, QUANTITY_INFO } from "../../shared/bench/quantities";
import { RULES } from "../../shared/bench/rules";
import { REQUIRED_READINGS } from "../../shared/bench/rules/required";
import { crossChecksApiSection } from "./crosscheck-doc";

const DOC = new URL("../../docs/api.md", import.meta.url);
const HEADING = "## Check a bench sheet";

/** JSON that keeps short objects and arrays on one line. */
function pretty(v: unknown, indent = ""): string {
  const flat = JSON.stringify(v);
  if (v === null || typeof v !== "object" || flat.length + indent.length <= 110)
    return flat.replace(/":/g, '": ').replace(/,"/g, ', "').replace(/},{/g, "}, {");
  const inner = indent + "  ";
  if (Array.isArray(v)) return `[\n${v.map((x) => inner + pretty(x, inner)).join(",\n")}\n${indent}]`;
  return `{\n${Object.entries(v)
    .map(([k, x]) => `${inner}${JSON.stringify(k)}: ${pretty(x, inner)}`)
    .join(",\n")}\n${indent}}`;
}

export function benchSheetApiSection(): string {
  const req = exampleIntegratedAmplifierRequest();
  const res = checkBenchSheetJson(JSON.stringify(req));
  if (res.status !== 200 || !res.body.benchVerified) throw new Error("the example sheet must be bench-verified");
  const bad = JSON.parse(JSON.stringify(req));
  bad.readings[5].value = 198;
  bad.readings[6].value = 195;
  const badRes = checkBenchSheetJson(JSON.stringify(bad));
  if (badRes.status !== 200) throw new Error("the doctored sheet must be checkable");
  const b = badRes.body;
  const inv = JSON.parse(JSON.stringify(req));
  inv.readings[0].value = "sixty";
  inv.readings[3].unit = "Ω";
  const invRes = checkBenchSheetJson(JSON.stringify(inv));

  const cats = (q: (typeof QUANTITIES)[number]) => {
    const cs = CATEGORIES.filter((c) => CATEGORY_QUANTITIES[c].includes(q));
    return cs.length === CATEGORIES.length ? "all" : cs.map((c) => `\`${c}\``).join(", ");
  };
  const qRows = QUANTITIES.map(
    (q) => `| \`${q}\` | ${QUANTITY_INFO[q].label} | ${QUANTITY_INFO[q].baseUnit || "plain number"} | ${cats(q)} |`,
  ).join("\n");
  const ruleRows = RULES.map((r) => `| \`${r.id}\` | ${r.title} | ${r.source} |`).join("\n");
  const reqRows = CATEGORIES.map(
    (c) =>
      `| \`${c}\` | ${REQUIRED_READINGS[c].map((x) => x.label + (x.ratedIsEnough ? " (the maker's figure is enough)" : "")).join("; ")} |`,
  ).join("\n");

  return `${HEADING}

### \`POST /api/v1/bench-sheets/check\`

Open to anyone; no account needed. The check reads nothing and stores nothing: the same code runs in
the browser while a seller types, and on the server as the authority when a listing is published.

- Request: \`Content-Type: application/json\`, a **bench sheet** (below), at most 512 KB.
- \`200\`: the **verdict** (below). A sheet that fails its checks still gets \`200\`; read \`benchVerified\`.
- \`400 {"error":"invalid_json","message"}\`: the body is not JSON.
- \`400 {"error":"invalid_sheet","message","issues":[{"path","message"}]}\`: the JSON does not fit the
  schema; each issue names the path of the field, e.g. \`readings.0.value\`.
- \`405 {"error":"method_not_allowed","message"}\` for anything but POST (with \`Allow: POST\`);
  \`413 {"error":"too_large","message":"A bench sheet may be at most 512 KB."}\`; \`415\` when the body is
  not \`application/json\`; \`403 cross_origin\` from a page on another origin.

> Safety: the figures on a bench sheet come from live, mains-powered units driving dummy loads. Mains
> voltage and charged filter capacitors stay inside after unplugging, dummy loads and heatsinks get hot,
> and a shorted or wrongly grounded (bridged) output can destroy the amplifier. Leave bench work to a
> qualified technician and follow your local electrical-safety rules.

#### The bench sheet

| field | |
|---|---|
| \`category\` | \`${CATEGORIES.join("` · `")}\` |
| \`readings\` | up to 300 readings (below) |
| \`sweeps\` | optional, up to 16 response sweeps: \`{kind: "riaa" \\| "flat", variant?: "riaa" \\| "riaa_iec", channel?, origin?, captureId?, conditions?, points: [{frequencyHz, levelDb}]}\`, frequencies rising, 3–4000 points; levels on any dB reference (the bench normalises at 1 kHz). \`riaa\` sweeps only for phono stages and amplifiers with a phono input. |
| \`equipment\` | optional \`{maker, model, serial, year}\` |
| \`channelCount\` | optional, 1–8 (2 unless told; 1 for a mono block) |
| \`bridged\` | optional, amplifiers only: a bridged output may swing twice a rail |
| \`measuredOn\`, \`measuredBy\`, \`notes\`, \`id\` | optional |

Each **reading**:

| field | |
|---|---|
| \`quantity\` | one of the quantities below that the category has |
| \`value\` | number **in base units** (table below): W, V rms, a ratio as a fraction (0.0001 = 0.01 %), dB, Hz, s, Ω, V/s |
| \`unit\` | the unit as typed, for display (\`"W"\`, \`"Vpp"\`, \`"%"\`, \`"dB"\`, \`"µs"\`, \`"V/µs"\`, \`"dB(A)"\`, \`"dB/2.83 V/1 m"\`…); it must fit the quantity |
| \`basis\` | \`"rated"\` (the maker's figure) or \`"measured"\` (this unit on the bench); the two are never mixed up |
| \`origin\` | \`"typed"\` (default) or \`"capture"\`, with \`captureId\` (see *Analyse a capture*) |
| \`channel\` | optional \`left · right · both · mono\` |
| \`conditions\` | optional: \`loadOhm\`, \`frequencyHz\`, \`frequencyRange {lowHz, highHz}\`, \`powerW\` / \`voltageV\` (output level, or a loudspeaker's drive), \`atDistortion {ratio, measure: "thd" \\| "thd_n"}\`, \`bandwidth {lowHz, highHz}\`, \`weighting\` (\`A · CCIR-468 · unweighted · IEC-60386-peak · WRMS\`), \`channelsDriven\` (\`one · both · all\`), \`mainsV\`, \`warmUpS\`, \`testToneHz\`, \`distanceM\`, \`speedRpm\`, \`tapeSpeedCmS\`, \`supply\` (\`split · single\`), \`sourceOhm\` (the source a noise figure's input was terminated in), \`temperatureC\` |
| \`text\`, \`note\`, \`id\` | optional: the value exactly as typed, a remark, a client key |

Unknown fields are refused (so a misspelt \`load\` does not silently vanish). In TypeScript,
\`parseValue("80 Vpp")\` from \`@shared/bench\` turns what a seller types into \`value\` and \`unit\`.

| quantity | label | base unit of \`value\` | categories |
|---|---|---|---|
${qRows}

#### The verdict

- \`benchVerified\`: true only when every reading the category requires is on the sheet **measured**
  (not only rated) and no result is \`questionable\`, \`implausible\` or \`missing\`.
- \`summary\`: one sentence for the listing.
- \`results[]\`: one entry per thing checked: \`ruleId\` (stable), \`title\`, \`outcome\`
  (\`consistent · questionable · implausible · missing\`), \`explanation\` (plain words, the same for every
  sheet), \`source\`, \`detail\` (what this sheet showed), \`refs\` (paths of the readings or sweeps
  compared) and \`compared[]\` (\`{label, value, unit, display}\`, value in base units).
- \`counts\`, \`skipped[]\` (rules for the category that found nothing to check, with the reason),
  \`derived[]\` (values the bench worked out, e.g. the bandwidth a rise time implies),
  \`shortfalls[]\` (where the unit measures below its maker's rating: reported, never held against the
  sheet), \`fromCaptures[]\` (figures that came from captures), \`hazards[]\` (readings that make the unit
  unsafe to connect; see *Cross-checks and safety*), \`rulesVersion\`.

| rule | checks | rests on |
|---|---|---|
${ruleRows}

Readings each category needs measured for the mark:

| category | required |
|---|---|
${reqRows}

#### Example: an integrated amplifier

An invented 2 × 60 W integrated amplifier, restored and measured (distortion and rise time from captures):

\`\`\`sh
curl -s -X POST http://localhost:3000/api/v1/bench-sheets/check \\
  -H 'Content-Type: application/json' --data @sheet.json
\`\`\`

\`sheet.json\`:

\`\`\`json
${pretty(req)}
\`\`\`

Response (\`200\`), produced by running the check on exactly this sheet (\`scripts/bench/sheet-doc.ts\`):

\`\`\`json
${pretty(res.body)}
\`\`\`

The same sheet with the 4 Ω powers typed as 198 W and 195 W (three times the 8 Ω figures) is not
bench-verified; abridged to the results that are not consistent:

\`\`\`json
${pretty({ benchVerified: b.benchVerified, summary: b.summary, counts: b.counts, results: b.results.filter((r) => r.outcome !== "consistent").map(({ explanation: _e, source: _s, ...r }) => r) })}
\`\`\`

A sheet that does not fit the schema (\`readings.0.value\` typed as text, an output power in ohms):

\`\`\`
HTTP/1.1 ${invRes.status}
${pretty(invRes.body)}
\`\`\`

${crossChecksApiSection(pretty)}`;
}

/** Replace the section in docs/api.md (or append it). */
export function writeBenchSheetApiSection(): void {
  const section = benchSheetApiSection();
  const doc = existsSync(DOC) ? readFileSync(DOC, "utf8") : "# Loadline API\n";
  const start = doc.indexOf(`\n${HEADING}\n`);
  let next: string;
  if (start < 0) next = `${doc.trimEnd()}\n\n${section}`;
  else {
    const after = doc.indexOf("\n## ", start + HEADING.length + 1);
    next = `${doc.slice(0, start + 1)}${section}${after < 0 ? "" : `\n${doc.slice(after + 1)}`}`;
  }
  writeFileSync(DOC, next);
}

if (import.meta.url === `file://${process.argv[1]}`) writeBenchSheetApiSection();
