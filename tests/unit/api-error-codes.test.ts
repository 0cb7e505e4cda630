import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ERROR_CODES } from "~/http/errors.server";
import { CAPTURE_ERROR_STATUS } from "@shared/bench/analysis";

// docs/api.md lists every error code the API answers with, and its status; this keeps the list and
// the code the same.
const doc = fs.readFileSync(path.resolve(import.meta.dirname, "../../docs/api.md"), "utf8");

function documentedCodes(): Record<string, number> {
  const start = doc.indexOf("| code | status | meaning |");
  const rows = doc.slice(start).split("\n").slice(2);
  const out: Record<string, number> = {};
  for (const row of rows) {
    if (!row.startsWith("|")) break;
    const [, codes, status] = row.split("|").map((c) => c.trim());
    for (const [, code] of codes.matchAll(/`([a-z_]+)`/g)) out[code] = Number(status);
  }
  return out;
}

describe("the API's error codes", () => {
  it("are each listed in docs/api.md with their status", () => {
    expect(documentedCodes()).toEqual({ ...ERROR_CODES });
  });

  it("include every capture refusal, with the same status", () => {
    for (const [code, status] of Object.entries(CAPTURE_ERROR_STATUS))
      expect([code, ERROR_CODES[code as keyof typeof ERROR_CODES]]).toEqual([code, status]);
  });
});
