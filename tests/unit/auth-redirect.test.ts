import { describe, expect, it } from "vitest";
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
});

describe("signInPath", () => {
  it("carries the refused page along", () => {
    expect(signInPath("/admin/users?q=ada")).toBe("/sign-in?redirectTo=%2Fadmin%2Fusers%3Fq%3Dada");
  });
  it("drops a target that is not a local page", () => {
    expect(signInPath("//elsewhere.example")).toBe("/sign-in");
  });
});
