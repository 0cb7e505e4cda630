// The "Cross-checks and safety" part of docs/api.md's "Check a bench sheet" section: the demo sheets of
// shared/bench/examples-cross.ts sent through the check, with the answers the check actually gives.
// Written by scripts/bench/sheet-doc.ts together with the rest of that section.
import { checkBenchSheetJson } from "../../shared/bench/api";
import { doctoredCrossCheckedSheet, exampleCrossCheckedSheet, offSpeedTurntableSheet } from "../../shared/bench/examples-cross";
import type { BenchSheet } from "../../shared/bench/schema";

type Pretty = (v: unknown, indent?: string) => string;

/** As an API client sends it: the defaults (origin "typed", empty conditions and sweeps) left out. */
function request(sheet: BenchSheet) {
  const { sweeps: _defaulted, ...rest } = sheet;
  return {
    ...rest,
    readings: sheet.readings.map(({ origin, conditions, ...r }) => ({
      ...r,
      ...(origin === "capture" ? { origin } : {}),
      ...(Object.keys(conditions).length ? { conditions } : {}),
    })),
  };
}

function check(sheet: BenchSheet) {
  const res = checkBenchSheetJson(JSON.stringify(request(sheet)));
  if (res.status !== 200) throw new Error("the cross-check examples must fit the schema");
  return res.body;
}

export function crossChecksApiSection(pretty: Pretty): string {
  const good = check(exampleCrossCheckedSheet());
  if (!good.benchVerified) throw new Error("the cross-checked example must be bench-verified");
  const bad = check(doctoredCrossCheckedSheet());
  const tt = check(offSpeedTurntableSheet());
  const abridged = (v: typeof bad) => ({
    benchVerified: v.benchVerified,
    summary: v.summary,
    counts: v.counts,
    results: v.results.filter((r) => r.outcome !== "consistent").map(({ explanation: _e, source: _s, ...r }) => r),
    hazards: v.hazards,
  });
  return `### Cross-checks and safety

Besides the rules that look at one relation each, the bench ties a sheet's figures together: the
signal-to-noise ratio against the output noise and its reference (\`snr-noise-reference\`), gain against
input sensitivity and the output it drives (\`gain-sensitivity-output\`), a power quoted at a distortion limit
against the distortion readings between 250 mW and that power (\`power-at-distortion-limit\`), the slew rate
against the edge a rise time measured (\`slew-rate-rise-time\`), and a typed figure against the capture or
sweep that should have produced it (\`typed-vs-capture\`). Physical floors: nothing quieter than the thermal
noise of the stated source impedance (\`thermal-noise-floor\`, with \`conditions.sourceOhm\` and a
\`bandwidth\`; 290 K unless \`conditions.temperatureC\`), nothing cleaner than the analyser's stated residual
(\`analyser-stated-floor\`, from the sheet's \`analyser\`), nothing faster than the instrument's bandwidth
(\`instrument-bandwidth\`).

Some readings mean the unit is **unsafe to connect**: DC at a loudspeaker output beyond ±50 mV
(\`dc-offset-safe\`, common practice), an output seen oscillating (the quantity \`oscillation\`, its frequency in
Hz; \`output-oscillation\`), a turntable more than 10 % off speed (\`turntable-far-off-speed\`). Each is listed in
the verdict's \`hazards[]\` (\`{ruleId, title, detail, refs}\`) and blocks the mark; a published listing with one is
held for the review desk with the reason "Unsafe to connect: …", and its page shows the warning with the usual
cautions.

The sheet may say what measured it:

| field | |
|---|---|
| \`analyser\` | optional \`{residualThdN?, residualThd?, noiseFloorV?, bandwidthHz?}\`: the analyser's residual THD+N and THD (fractions), its noise floor (V rms) and the bandwidth of the analyser or oscilloscope (Hz) |

Balance between channels is checked whenever both channels are measured, but it is not a required reading:
a sheet with nothing to compare skips the check and can still earn the mark. A power measured at a looser
distortion limit than the maker's rating is compared with it, and the verdict says the limits differ.

#### Example: a power amplifier whose figures tie together

\`sheet.json\`:

\`\`\`json
${pretty(request(exampleCrossCheckedSheet()))}
\`\`\`

Response (\`200\`):

\`\`\`json
${pretty(good)}
\`\`\`

The same sheet with one figure in each pair changed (rated gain 35 dB, typed THD 0.02 %, right THD 0.15 % at
10 W, THD+N 0.0001 %, SNR 110 dB, noise 5 µV, rise time 0.5 µs, slew rate 0.2 V/µs, left offset 80 mV),
abridged to the results that are not consistent:

\`\`\`json
${pretty(abridged(bad))}
\`\`\`

A turntable whose 60 Hz motor runs on 50 Hz mains:

\`\`\`json
${pretty(request(offSpeedTurntableSheet()))}
\`\`\`

\`\`\`json
${pretty(abridged(tt))}
\`\`\`
`;
}
