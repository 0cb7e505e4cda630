// Stripe's request encoding: form bodies and query strings with bracketed nesting
// (`metadata[order]=7`, `line_items[0][price_data][unit_amount]=1200`, `expand[]=x`).

export type Params = { [key: string]: ParamValue };
export type ParamValue = string | Params | ParamValue[];

export function parseStripeParams(encoded: string): Params {
  const root: Params = {};
  for (const [rawKey, value] of new URLSearchParams(encoded)) {
    const path = splitKey(rawKey);
    if (!path) continue;
    assign(root, path, value);
  }
  return normaliseArrays(root) as Params;
}

function splitKey(key: string): string[] | null {
  const m = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(key);
  if (!m) return null;
  const rest = [...m[2].matchAll(/\[([^[\]]*)\]/g)].map((x) => x[1]);
  return [m[1], ...rest];
}

// Objects keyed "0","1",… and "[]" pushes become arrays afterwards, so order of fields does not matter.
const PUSH = "\u0000push";

function assign(target: Params, path: string[], value: string): void {
  let node: Params = target;
  for (let i = 0; i < path.length - 1; i++) {
    const key = path[i] === "" ? `${PUSH}${Object.keys(node).length}` : path[i];
    const next = node[key];
    if (typeof next !== "object" || Array.isArray(next)) node[key] = {};
    node = node[key] as Params;
  }
  const last = path[path.length - 1];
  node[last === "" ? `${PUSH}${Object.keys(node).length}` : last] = value;
}

function normaliseArrays(value: ParamValue): ParamValue {
  if (typeof value === "string" || Array.isArray(value)) return value;
  const keys = Object.keys(value);
  const arrayLike = keys.length > 0 && keys.every((k) => /^\d+$/.test(k) || k.startsWith(PUSH));
  if (arrayLike) {
    return keys
      .map((k) => [k.startsWith(PUSH) ? Number(k.slice(PUSH.length)) : Number(k), value[k]] as const)
      .sort((a, b) => a[0] - b[0])
      .map(([, v]) => normaliseArrays(v));
  }
  const out: Params = {};
  for (const k of keys) out[k] = normaliseArrays(value[k]);
  return out;
}

/** Stable text of the parameters, for idempotency comparisons. */
export function fingerprint(params: Params): string {
  const sort = (v: ParamValue): unknown =>
    typeof v === "string"
      ? v
      : Array.isArray(v)
        ? v.map(sort)
        : Object.fromEntries(
            Object.keys(v)
              .sort()
              .map((k) => [k, sort(v[k])]),
          );
  return JSON.stringify(sort(params));
}
