import { describe, expect, it } from "vitest";
import { commonSecurityHeaders, contentSecurityPolicy, newNonce } from "~/http/security-headers.server";

const directives = (policy: string) => Object.fromEntries(policy.split("; ").map((d) => [d.split(" ")[0], d.split(" ").slice(1)]));

describe("security headers", () => {
  it("sends HSTS only when the public address is https", () => {
    expect(new Map(commonSecurityHeaders({ https: false })).has("Strict-Transport-Security")).toBe(false);
    expect(new Map(commonSecurityHeaders({ https: true })).get("Strict-Transport-Security")).toBe("max-age=31536000; includeSubDomains");
  });

  it("switches off camera, microphone and geolocation, and forbids framing and sniffing", () => {
    const h = new Map(commonSecurityHeaders({ https: false }));
    expect(h.get("Permissions-Policy")).toMatch(/camera=\(\)/);
    expect(h.get("Permissions-Policy")).toMatch(/microphone=\(\)/);
    expect(h.get("Permissions-Policy")).toMatch(/geolocation=\(\)/);
    expect(h.get("X-Frame-Options")).toBe("DENY");
    expect(h.get("X-Content-Type-Options")).toBe("nosniff");
    expect(h.get("Referrer-Policy")).toBe("strict-origin-when-cross-origin");
  });

  it("allows inline scripts only with the response's nonce, never eval, and no framing", () => {
    const nonce = newNonce();
    const d = directives(contentSecurityPolicy({ nonce, formTargets: ["http://127.0.0.1:4010"] }));
    expect(d["script-src"]).toEqual(["'self'", `'nonce-${nonce}'`]);
    expect(d["frame-ancestors"]).toEqual(["'none'"]);
    expect(d["object-src"]).toEqual(["'none'"]);
    expect(d["base-uri"]).toEqual(["'none'"]);
    expect(d["form-action"]).toEqual(["'self'", "http://127.0.0.1:4010"]);
    expect(d["style-src-elem"]).toEqual(["'self'"]);
    expect(d["connect-src"]).toEqual(["'self'"]);
    expect(d["upgrade-insecure-requests"]).toBeUndefined();
    expect(directives(contentSecurityPolicy({ nonce, https: true }))["upgrade-insecure-requests"]).toEqual([]);
  });

  it("loosens only what Vite's dev server needs: its style elements and the HMR socket", () => {
    const strict = directives(contentSecurityPolicy({ nonce: "n" }));
    const dev = directives(contentSecurityPolicy({ nonce: "n", dev: true }));
    expect(dev["script-src"]).toEqual(strict["script-src"]);
    expect(dev["style-src-elem"]).toContain("'unsafe-inline'");
    expect(dev["connect-src"]).toEqual(["'self'", "ws:", "wss:"]);
  });

  it("makes a different nonce every time", () => {
    const nonces = new Set(Array.from({ length: 100 }, newNonce));
    expect(nonces.size).toBe(100);
  });
});
