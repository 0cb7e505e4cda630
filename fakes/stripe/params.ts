import { invalid, missingParam, unknownParam } from "./errors";
import type { Params, ParamValue } from "./form";

// Reads request parameters the way Stripe validates them: unknown keys refused, types checked,
// errors naming the parameter path (e.g. `line_items[0][quantity]`).

export class P {
  constructor(
    private readonly params: Params,
    allowed: string[],
    private readonly prefix = "",
  ) {
    for (const key of Object.keys(params)) {
      if (key !== "expand" && !allowed.includes(key)) throw unknownParam(this.name(key));
    }
  }

  name(key: string): string {
    return this.prefix ? `${this.prefix}[${key}]` : key;
  }

  has(key: string): boolean {
    return this.params[key] !== undefined;
  }

  private scalar(key: string): string | undefined {
    const v = this.params[key];
    if (v === undefined) return undefined;
    if (typeof v !== "string") throw invalid(`Invalid string: ${this.name(key)} must be a string`, this.name(key));
    return v;
  }

  str(key: string, opts: { required?: boolean; max?: number } = {}): string | undefined {
    const v = this.scalar(key);
    if (v === undefined || v === "") {
      if (opts.required) throw missingParam(this.name(key));
      return undefined;
    }
    if (opts.max && v.length > opts.max) {
      throw invalid(`Invalid ${this.name(key)}: must be at most ${opts.max} characters`, this.name(key));
    }
    return v;
  }

  int(key: string, opts: { required?: boolean; min?: number; max?: number } = {}): number | undefined {
    const v = this.str(key, { required: opts.required });
    if (v === undefined) return undefined;
    if (!/^-?\d+$/.test(v)) throw invalid(`Invalid integer: ${v}`, this.name(key));
    const n = Number(v);
    if (opts.min !== undefined && n < opts.min) {
      throw invalid(`This value must be greater than or equal to ${opts.min}.`, this.name(key));
    }
    if (opts.max !== undefined && n > opts.max) {
      throw invalid(`This value must be less than or equal to ${opts.max}.`, this.name(key));
    }
    return n;
  }

  bool(key: string): boolean | undefined {
    const v = this.str(key);
    if (v === undefined) return undefined;
    if (v !== "true" && v !== "false") throw invalid(`Invalid boolean: ${v}`, this.name(key));
    return v === "true";
  }

  oneOf<T extends string>(key: string, values: readonly T[], opts: { required?: boolean } = {}): T | undefined {
    const v = this.str(key, opts);
    if (v === undefined) return undefined;
    if (!values.includes(v as T)) {
      throw invalid(`Invalid ${this.name(key)}: must be one of ${values.join(", ")}`, this.name(key));
    }
    return v as T;
  }

  currency(key: string, opts: { required?: boolean } = {}): string | undefined {
    const v = this.str(key, opts);
    if (v === undefined) return undefined;
    if (!/^[a-zA-Z]{3}$/.test(v)) throw invalid(`Invalid currency: ${v}.`, this.name(key));
    return v.toLowerCase();
  }

  url(key: string, opts: { required?: boolean } = {}): string | undefined {
    const v = this.str(key, { ...opts, max: 5000 });
    if (v === undefined) return undefined;
    try {
      const u = new URL(v.replace(/\{CHECKOUT_SESSION_ID\}/g, "x"));
      if (u.protocol !== "http:" && u.protocol !== "https:") throw new Error();
    } catch {
      throw invalid(`Not a valid URL`, this.name(key), "url_invalid");
    }
    return v;
  }

  obj(key: string, allowed: string[], opts: { required?: boolean } = {}): P | undefined {
    const v = this.params[key];
    if (v === undefined || v === "") {
      if (opts.required) throw missingParam(this.name(key));
      return undefined;
    }
    if (typeof v !== "object" || Array.isArray(v)) throw invalid(`Invalid object`, this.name(key));
    return new P(v, allowed, this.name(key));
  }

  list(key: string, allowed: string[]): P[] {
    const v = this.params[key];
    if (v === undefined || v === "") return [];
    if (!Array.isArray(v)) throw invalid(`Invalid array`, this.name(key));
    return v.map((item, i) => {
      if (typeof item !== "object" || Array.isArray(item)) throw invalid(`Invalid object`, `${this.name(key)}[${i}]`);
      return new P(item, allowed, `${this.name(key)}[${i}]`);
    });
  }

  strings(key: string): string[] {
    const v: ParamValue | undefined = this.params[key];
    if (v === undefined || v === "") return [];
    if (typeof v === "string") return [v];
    if (!Array.isArray(v) || v.some((x) => typeof x !== "string")) throw invalid(`Invalid array`, this.name(key));
    return v as string[];
  }

  /** Stripe metadata: up to 50 keys, keys ≤ 40 chars, values ≤ 500 chars; an empty value unsets a key. */
  metadata(current: Record<string, string> = {}, key = "metadata"): Record<string, string> {
    const v = this.params[key];
    if (v === undefined) return current;
    if (v === "") return {};
    if (typeof v !== "object" || Array.isArray(v)) throw invalid("Invalid object", this.name(key));
    const out = { ...current };
    for (const [k, val] of Object.entries(v)) {
      if (typeof val !== "string") throw invalid("Metadata values must be strings", `${this.name(key)}[${k}]`);
      if (k.length > 40) throw invalid("Metadata keys can be at most 40 characters long", `${this.name(key)}[${k}]`);
      if (val.length > 500) throw invalid("Metadata values can be at most 500 characters long", `${this.name(key)}[${k}]`);
      if (val === "") delete out[k];
      else out[k] = val;
    }
    if (Object.keys(out).length > 50) throw invalid("Metadata can have at most 50 keys", this.name(key));
    return out;
  }
}
