// The stated conditions of an upload: a JSON `conditions` field, or plain form fields for curl and
// HTML forms (kind, scale, volts, basis, fullScaleVolts, attenuation, loadOhm, …).
import { captureConditionsSchema, type CaptureConditions, type CaptureKind } from "@shared/bench/analysis";

export type ConditionsIssue = { path: string; message: string };

export type ConditionsResult = { ok: true; conditions: CaptureConditions } | { ok: false; message: string; issues: ConditionsIssue[] };

const NUMBER_FIELDS = [
  "volts",
  "fullScaleVolts",
  "attenuation",
  "loadOhm",
  "fundamentalHz",
  "resolutionHz",
  "mainsV",
  "warmUpS",
  "frequencyHz",
  "bandwidthLowHz",
  "bandwidthHighHz",
  "bandLowHz",
  "bandHighHz",
  "ratedOhm",
  "driveV",
  "lowToneHz",
  "highToneHz",
  "nominalLoadOhm",
  "testToneHz",
  "speedRpm",
  "tapeSpeedCmS",
];

/** A form value as the schema wants it: numbers as numbers, "true"/"false" as booleans; blanks dropped. */
function field(form: FormData, name: string): unknown {
  const v = form.get(name);
  if (typeof v !== "string" || v.trim() === "") return undefined;
  const s = v.trim();
  if (NUMBER_FIELDS.includes(name)) {
    const n = Number(s);
    return Number.isFinite(n) ? n : s; // leave bad numbers for zod to name
  }
  if (s === "true" || s === "false") return s === "true";
  return s;
}

/** "100, 1000, 10000" as numbers; a bad entry is left for zod to name. */
function frequencyList(form: FormData): unknown {
  const v = form.get("frequenciesHz");
  if (typeof v !== "string" || v.trim() === "") return undefined;
  return v
    .split(/[\s,;]+/)
    .filter(Boolean)
    .map((x) => (Number.isFinite(Number(x)) ? Number(x) : x));
}

function flatConditions(form: FormData): Record<string, unknown> {
  const f = (n: string) => field(form, n);
  const band = (lo: string, hi: string) => (f(lo) === undefined && f(hi) === undefined ? undefined : { lowHz: f(lo), highHz: f(hi) });
  const scaleKind = f("scale");
  const scale =
    scaleKind === "volts-per-full-scale"
      ? { kind: scaleKind, volts: f("volts"), basis: f("basis") }
      : scaleKind === "analyser"
        ? { kind: scaleKind, fullScaleVolts: f("fullScaleVolts"), basis: f("basis"), attenuation: f("attenuation") ?? 1 }
        : scaleKind;
  const raw: Record<string, unknown> = {
    kind: f("kind"),
    scale,
    loadOhm: f("loadOhm"),
    fundamentalHz: f("fundamentalHz"),
    bandwidth: band("bandwidthLowHz", "bandwidthHighHz"),
    weighting: f("weighting"),
    window: f("window"),
    resolutionHz: f("resolutionHz"),
    channel: f("channel"),
    channelsDriven: f("channelsDriven"),
    mainsV: f("mainsV"),
    warmUpS: f("warmUpS"),
    frequencyHz: f("frequencyHz"),
    levelUnit: f("levelUnit"),
    reference: f("reference"),
    iecPole: f("iecPole"),
    band: band("bandLowHz", "bandHighHz"),
    ratedOhm: f("ratedOhm"),
    driveV: f("driveV"),
    driven: f("driven"),
    frequenciesHz: frequencyList(form),
    method: f("method"),
    lowToneHz: f("lowToneHz"),
    highToneHz: f("highToneHz"),
    nominalLoadOhm: f("nominalLoadOhm"),
    testToneHz: f("testToneHz"),
    convention: f("convention"),
    speedRpm: f("speedRpm"),
    tapeSpeedCmS: f("tapeSpeedCmS"),
  };
  return Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== undefined));
}

/**
 * Read and validate the conditions. `inferred` fills in the kind when the uploader left it out; the
 * kinds' own fields are then checked strictly, so a field meant for another kind is named.
 */
export function readConditions(form: FormData, inferred: CaptureKind | null): ConditionsResult {
  let raw: unknown;
  const json = form.get("conditions");
  if (typeof json === "string" && json.trim() !== "") {
    try {
      raw = JSON.parse(json);
    } catch {
      return { ok: false, message: "The conditions field is not valid JSON.", issues: [{ path: "conditions", message: "not valid JSON" }] };
    }
  } else {
    raw = flatConditions(form);
  }
  if (raw && typeof raw === "object" && !Array.isArray(raw) && (raw as { kind?: unknown }).kind === undefined) {
    if (!inferred) {
      return {
        ok: false,
        message:
          "Say what the capture is: kind must be sine, square, sweep, impedance, wow_flutter, separation, imd or output_impedance (the file alone does not tell).",
        issues: [{ path: "kind", message: "required" }],
      };
    }
    raw = { ...raw, kind: inferred };
  }
  // A flat form may carry fields for every kind; keep those of this kind. JSON is taken as sent.
  if (typeof json !== "string" || json.trim() === "") raw = onlyFieldsOfKind(raw as Record<string, unknown>);
  const r = captureConditionsSchema.safeParse(raw);
  if (r.success) return { ok: true, conditions: r.data };
  const issues = r.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "conditions", message: i.message }));
  const named = issues.map((i) => `${CONDITION_LABELS[i.path] ?? i.path}: ${i.message}`);
  return { ok: false, message: `The stated conditions do not fit. ${named.join("; ")}.`, issues };
}

/** The capture form's own labels, so a refusal names the field the seller sees. */
const CONDITION_LABELS: Record<string, string> = {
  "scale.volts": "Full scale stands for",
  "scale.fullScaleVolts": "Analyser full scale",
  "scale.attenuation": "Attenuation",
  loadOhm: "Load",
  "bandwidth.lowHz": "Measurement bandwidth (low end)",
  "bandwidth.highHz": "Measurement bandwidth (high end)",
  channel: "Channel",
  channelsDriven: "Channels driven",
  fundamentalHz: "Test frequency",
  mainsV: "Mains voltage",
  warmUpS: "Warm-up",
  ratedOhm: "Rated impedance",
  driveV: "Drive level",
  method: "Method",
  lowToneHz: "Low tone",
  highToneHz: "High tone",
  nominalLoadOhm: "Damping factor quoted into",
  frequenciesHz: "Test tones",
  driven: "Driven channel",
  testToneHz: "Test tone",
  speedRpm: "Speed",
  tapeSpeedCmS: "Tape speed",
};

const KIND_FIELDS: Record<string, string[]> = {
  sine: [
    "kind",
    "scale",
    "loadOhm",
    "fundamentalHz",
    "bandwidth",
    "weighting",
    "window",
    "resolutionHz",
    "channel",
    "channelsDriven",
    "mainsV",
    "warmUpS",
  ],
  square: ["kind", "channel", "loadOhm", "frequencyHz"],
  sweep: ["kind", "levelUnit", "reference", "iecPole", "band", "channel", "loadOhm"],
  impedance: ["kind", "ratedOhm", "band", "channel", "driveV"],
  separation: ["kind", "driven", "frequenciesHz", "scale", "loadOhm"],
  imd: ["kind", "method", "lowToneHz", "highToneHz", "scale", "loadOhm", "channel", "channelsDriven"],
  output_impedance: ["kind", "loadOhm", "nominalLoadOhm", "frequencyHz", "scale", "channel"],
  wow_flutter: ["kind", "testToneHz", "convention", "speedRpm", "tapeSpeedCmS", "channel"],
};

function onlyFieldsOfKind(raw: Record<string, unknown>): Record<string, unknown> {
  const keep = KIND_FIELDS[String(raw.kind)];
  if (!keep) return raw;
  return Object.fromEntries(Object.entries(raw).filter(([k]) => keep.includes(k)));
}
