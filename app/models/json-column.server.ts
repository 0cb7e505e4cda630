import type { z } from "zod";

// A JSON column is read through its schema, once per stored value: the model hands out real types,
// so nothing past the model casts. A value stored in a shape today's schema refuses (written before a
// schema change) reads as the column's empty value — no figures rather than wrong ones — and is
// logged once. Writes are typed by the model's declarations; callers parse their input before.

type Schema<T> = Pick<z.ZodType<T>, "safeParse">;

/** The column's getter body: `get() { return readSheet(this.getDataValue("sheet")); }`. */
export function jsonColumn<T, E = null>(column: string, schema: Schema<T>, empty: () => E): (raw: unknown) => T | E {
  const seen = new WeakMap<object, T | E>();
  const read = (raw: unknown): T | E => {
    if (raw === null || raw === undefined) return empty();
    const parsed = schema.safeParse(raw);
    if (parsed.success) return parsed.data;
    const first = parsed.error.issues[0];
    console.warn(`[models] ${column}: a stored value no longer fits its schema (${first?.path.join(".") || "value"}: ${first?.message})`);
    return empty();
  };
  return (raw) => {
    if (raw === null || typeof raw !== "object") return read(raw);
    const hit = seen.get(raw);
    if (hit !== undefined) return hit;
    const value = read(raw);
    seen.set(raw, value);
    return value;
  };
}

export const none = () => null;
