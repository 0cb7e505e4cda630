import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { jsonColumn, none } from "~/models/json-column.server";

// A JSON column's getter: parsed through its schema once per stored value, and a value that no
// longer fits reads as the column's empty value (logged once) instead of reaching a page as is.

const point = z.object({ x: z.number(), y: z.number().default(0) });

afterEach(() => vi.restoreAllMocks());

describe("reading a JSON column", () => {
  it("hands out the schema's output, defaults filled in", () => {
    const read = jsonColumn("t.point", point, none);
    expect(read({ x: 1 })).toEqual({ x: 1, y: 0 });
  });

  it("parses each stored value once, however often it is read", () => {
    const spy = vi.spyOn(point, "safeParse");
    const read = jsonColumn("t.point", point, none);
    const stored = { x: 2 };
    expect(read(stored)).toBe(read(stored));
    read(stored);
    expect(spy).toHaveBeenCalledTimes(1);
    read({ x: 2 });
    expect(spy).toHaveBeenCalledTimes(2);
  });

  it("reads a value stored in an older shape as empty, and says so once", () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const read = jsonColumn("t.points", z.array(point), () => []);
    const stale = [{ x: "one" }];
    expect(read(stale)).toEqual([]);
    expect(read(stale)).toEqual([]);
    expect(warn).toHaveBeenCalledTimes(1);
    expect(String(warn.mock.calls[0][0])).toContain("t.points");
  });

  it("reads null as empty without a warning", () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    expect(jsonColumn("t.point", point, none)(null)).toBeNull();
    expect(warn).not.toHaveBeenCalled();
  });
});
