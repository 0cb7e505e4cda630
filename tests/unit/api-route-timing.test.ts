import { describe, expect, it } from "vitest";
import { apiRoute, json } from "~/http/api-route.server";

// Every API answer says how long the server spent on it, refusals included: `npm run bench` reads it
// to tell the server's time from the network's.
describe("apiRoute's Server-Timing header", () => {
  const route = apiRoute({
    GET: async () => {
      await new Promise((r) => setTimeout(r, 20));
      return json({ ok: true });
    },
  });
  const request = (method: string) => new Request("http://127.0.0.1/api/v1/example", { method });

  it("times the handler's answer", async () => {
    const res = await route.loader({ request: request("GET") });
    const dur = /^app;dur=(\d+\.\d)$/.exec(res.headers.get("Server-Timing") ?? "")?.[1];
    expect(dur, res.headers.get("Server-Timing") ?? "no header").toBeDefined();
    expect(Number(dur)).toBeGreaterThanOrEqual(15);
  });

  it("times a refusal too", async () => {
    const res = await route.action({ request: request("DELETE") });
    expect(res.status).toBe(405);
    expect(res.headers.get("Server-Timing")).toMatch(/^app;dur=\d+\.\d$/);
  });
});
