import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { safeRedirect, signInPath } from "~/auth/redirect";

// After sign-in the browser goes where `redirectTo` says, so it must never leave the site
// (open-redirect cases after OWASP's "Unvalidated Redirects and Forwards" cheat sheet).
describe("safeRedirect", () => {
  it("keeps a local path with its query and fragment", () => {
    expect(safeRedirect("/desk")).toBe("/desk");
    expect(safeRedirect("/market?category=turntables&page=2#results")).toBe("/market?category=turntables&page=2#results");
  });

  it.each([
    ["https://elsewhere.example/phish"],
    ["//elsewhere.example/phish"],
    ["/\\elsewhere.example"],
    ["\\\\elsewhere.example"],
    ["javascript:alert(1)"],
    ["desk"],
    ["/\t/elsewhere.example"],
    ["/%0d%0aSet-Cookie:x=1".replace("%0d%0a", "\r\n")],
    [""],
    [null],
    [42],
  ])("refuses %j and falls back", (input) => {
    expect(safeRedirect(input, "/fallback")).toBe("/fallback");
  });

  it("does not send a freshly signed-in person back to a sign-in page", () => {
    expect(safeRedirect("/sign-in?redirectTo=/desk")).toBe("/");
    expect(safeRedirect("/sign-out")).toBe("/");
    expect(safeRedirect("/reset-password/abc")).toBe("/");
    expect(safeRedirect("/auth/oauth/callback?code=x")).toBe("/");
    // …but a page whose name merely starts the same way is fine.
    expect(safeRedirect("/sign-infographics")).toBe("/sign-infographics");
  });

  it("normalises dot segments instead of trusting them", () => {
    expect(safeRedirect("/account/../desk")).toBe("/desk");
  });

  // Each of these resolved to "//evil.example", which a browser reads as another site.
  it.each([
    ["/.//evil.example"],
    ["/..//evil.example"],
    ["/%2e//evil.example"],
    ["/x/../..//evil.example"],
    ["/%2E%2e//evil.example"],
    ["/.%2e//evil.example"],
    ["/%252e//evil.example"],
    ["/a/..%2f..%2f/evil.example"],
    ["/%2f%2fevil.example"],
    ["/%5cevil.example"],
    ["/%2e/%5c/evil.example"],
    ["/%09/evil.example"],
    ["/SIGN-IN?redirectTo=/desk"],
  ])("refuses %j, whose resolved or decoded path leaves the site or loops", (input) => {
    expect(safeRedirect(input, "/fallback")).toBe("/fallback");
  });

  it("keeps encoded text that does not change the path", () => {
    expect(safeRedirect("/market?q=valve%20amp#top")).toBe("/market?q=valve%20amp#top");
    expect(safeRedirect("/listings/é")).toBe("/listings/%C3%A9");
  });
});

// Pieces an attacker strings together: dot segments, slashes and backslashes raw and percent-encoded
// (once and twice), whitespace browsers drop, and characters outside ASCII.
const PIECES = [
  "",
  ".",
  "..",
  "/",
  "//",
  "\\",
  "%2e",
  "%2E",
  "%2e%2e",
  ".%2e",
  "%2f",
  "%2F",
  "%5c",
  "%5C",
  "%252e",
  "%252f",
  "%25",
  "%",
  "\t",
  "\n",
  "\r",
  "%09",
  "%0a",
  "%00",
  " ",
  "@",
  ":",
  "?",
  "#",
  ";",
  "evil.example",
  "desk",
  "market",
  "é",
  "\u2215",
  "\uff0f",
  "\u3002",
  "\u202e",
  "\ud800",
  "http:",
  "javascript:",
];
const piece = fc.oneof(fc.constantFrom(...PIECES), fc.string({ maxLength: 4 }), fc.stringMatching(/^[a-z0-9-]{1,8}$/));
const crafted = fc.array(piece, { maxLength: 8 }).map((parts) => parts.join(""));

describe("safeRedirect: properties", () => {
  const ORIGIN = "https://loadline.example";

  it("whatever comes in, the answer is a path on this site that no browser reads as another host", () => {
    fc.assert(
      fc.property(
        fc.oneof(
          crafted,
          crafted.map((s) => `/${s}`),
          fc.string(),
        ),
        (input) => {
          const result = safeRedirect(input, "/fallback");
          expect(new URL(result, ORIGIN).origin).toBe(ORIGIN);
          expect(result).toMatch(/^\/(?![/\\])/);
          expect(result).not.toMatch(/[\u0000-\u001f\u007f]/);
        },
      ),
      { numRuns: 5_000 },
    );
  });

  it("keeps ordinary paths as they are", () => {
    const segment = fc.stringMatching(/^[a-z0-9][a-z0-9-]{0,11}$/);
    fc.assert(
      fc.property(fc.array(segment, { minLength: 1, maxLength: 5 }), (segments) => {
        const path = `/${segments.join("/")}`;
        fc.pre(!/^\/(sign-|forgot-|reset-|verify-|auth\/|auth$)/.test(path));
        expect(safeRedirect(path, "/fallback")).toBe(path);
      }),
    );
  });
});

describe("signInPath", () => {
  it("carries the refused page along", () => {
    expect(signInPath("/admin/users?q=ada")).toBe("/sign-in?redirectTo=%2Fadmin%2Fusers%3Fq%3Dada");
  });
  it("drops a target that is not a local page", () => {
    expect(signInPath("//elsewhere.example")).toBe("/sign-in");
  });
});
