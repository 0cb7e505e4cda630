import { describe, expect, it } from "vitest";
import { DatabaseError } from "sequelize";
import { handleError } from "~/entry.server";
import { loggable } from "~/http/log.server";

// What the web process writes when a request fails: enough to find the fault, never the values a
// database error carries (bench sheets, e-mail addresses).
describe("server error log lines", () => {
  it("keep a database error's message and code but not its SQL parameters", () => {
    const original = Object.assign(new Error('null value in column "maker" violates not-null constraint'), {
      code: "23502",
      sql: "INSERT INTO listings ...",
      parameters: ["seller@example.test", '{"notes":"private"}'],
    });
    const line = loggable(new DatabaseError(original));
    expect(line).toBe('SequelizeDatabaseError: null value in column "maker" violates not-null constraint (23502)');
    expect(line).not.toContain("seller@example.test");
  });

  it("keep an ordinary error's stack", () => {
    const line = loggable(new TypeError("x is undefined"));
    expect(line.startsWith("TypeError: x is undefined\n")).toBe(true);
    expect(line).toContain("server-error-log.test.ts");
  });

  // React Router hands handleError its own error responses (status, statusText, internal, data).
  it("name a route's error response by its status, and leave 4xx answers (a refused method, a missing page) out", () => {
    const refused = { status: 405, statusText: "Method Not Allowed", internal: true, data: "" };
    const broken = { status: 503, statusText: "Service Unavailable", internal: false, data: null };
    expect(loggable(refused)).toBe("405 Method Not Allowed");
    const lines: unknown[][] = [];
    const log = console.error;
    console.error = (...args: unknown[]) => void lines.push(args);
    try {
      const request = new Request("http://loadline.test/desk/documents/x", { method: "POST" });
      handleError(refused, { request });
      handleError(broken, { request });
    } finally {
      console.error = log;
    }
    expect(lines).toEqual([["[web] POST /desk/documents/x:", "503 Service Unavailable"]]);
  });
});
