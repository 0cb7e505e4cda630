import { createHash } from "node:crypto";
import type { BenchSheet } from "@shared/bench";

// What a certificate certifies: the bench sheet as read through its schema, written as JSON with every
// object's keys sorted (so the hash does not depend on how PostgreSQL or a client ordered them), then
// SHA-256 in hex. Any change to a reading, a condition, a sweep or a note gives another hash.

export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value && typeof value === "object") {
    const entries = Object.entries(value)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value) ?? "null";
}

export function sheetHash(sheet: BenchSheet): string {
  return createHash("sha256").update(canonicalJson(sheet), "utf8").digest("hex");
}
