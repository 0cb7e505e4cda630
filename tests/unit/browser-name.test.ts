import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { describeBrowser } from "~/auth/browser-name";

describe("describeBrowser", () => {
  it("names common browsers and systems", () => {
    const cases: [string, string][] = [
      ["Mozilla/5.0 (X11; Linux x86_64; rv:128.0) Gecko/20100101 Firefox/128.0", "Firefox on Linux"],
      [
        "Mozilla/5.0 (Windows NT 10.0; Win64; x64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Safari/537.36 Edg/126.0",
        "Edge on Windows",
      ],
      [
        "Mozilla/5.0 (Macintosh; Intel Mac OS X 14_5) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Safari/605.1.15",
        "Safari on macOS",
      ],
      [
        "Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) CriOS/126.0 Mobile/15E148 Safari/604.1",
        "Chrome on iOS",
      ],
      ["Mozilla/5.0 (Linux; Android 14) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Mobile Safari/537.36", "Chrome on Android"],
      ["Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) HeadlessChrome/131.0 Safari/537.36", "Chrome on Linux"],
    ];
    for (const [agent, name] of cases) expect(describeBrowser(agent)).toBe(name);
  });

  it("falls back to a short form of what was sent, or says it is unknown", () => {
    expect(describeBrowser(null)).toBe("Unknown browser");
    expect(describeBrowser("curl/8.5.0")).toBe("curl/8.5.0");
    fc.assert(
      fc.property(fc.string({ maxLength: 300 }), (agent) => {
        expect(describeBrowser(agent).length).toBeLessThanOrEqual(60);
      }),
    );
  });
});
