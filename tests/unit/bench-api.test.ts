import { describe, expect, it } from "vitest";
import { action, loader } from "~/routes/api.v1.bench-sheets.check";
import { exampleIntegratedAmplifierRequest, doctoredIntegratedAmplifierSheet } from "@shared/bench";
import { routeArgs } from "../support/route-args";

const URL_ = "http://localhost/api/v1/bench-sheets/check";

async function post(body: string) {
  const request = new Request(URL_, { method: "POST", body, headers: { "content-type": "application/json" } });
  const res = await action(routeArgs(request, {}));
  return { status: res.status, body: await res.json() };
}

describe("POST /api/v1/bench-sheets/check", () => {
  it("returns the verdict for a valid sheet", async () => {
    const { status, body } = await post(JSON.stringify(exampleIntegratedAmplifierRequest()));
    expect(status).toBe(200);
    expect(body.benchVerified).toBe(true);
    expect(body.results[0]).toEqual(expect.objectContaining({ ruleId: "required-readings", outcome: "consistent" }));
  });

  it("returns a failing verdict with status 200 (the sheet was checkable)", async () => {
    const { status, body } = await post(JSON.stringify(doctoredIntegratedAmplifierSheet()));
    expect(status).toBe(200);
    expect(body.benchVerified).toBe(false);
  });

  it("refuses invalid JSON", async () => {
    const { status, body } = await post("{ readings: [");
    expect(status).toBe(400);
    expect(body.error).toBe("invalid_json");
  });

  it("refuses a sheet that does not fit the schema, with the path of each problem", async () => {
    const s = JSON.parse(JSON.stringify(exampleIntegratedAmplifierRequest()));
    s.readings[0].value = "lots";
    delete s.readings[1].basis;
    const { status, body } = await post(JSON.stringify(s));
    expect(status).toBe(400);
    expect(body.error).toBe("invalid_sheet");
    expect(body.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(["readings.0.value", "readings.1.basis"]));
    expect(body.issues[0].message).toEqual(expect.any(String));
  });

  it("answers other methods with 405", async () => {
    const put = await action(routeArgs(new Request(URL_, { method: "PUT", body: "{}" }), {}));
    expect(put.status).toBe(405);
    expect(put.headers.get("Allow")).toBe("POST");
    const get = await loader(routeArgs(new Request(URL_), {}));
    expect(get.status).toBe(405);
  });

  it("refuses an oversized body", async () => {
    const { status, body } = await post(" ".repeat(600 * 1024));
    expect(status).toBe(413);
    expect(body.error).toBe("too_large");
  });
});
