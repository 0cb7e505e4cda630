// A person-readable name for a browser from its user agent, for the session list on /account. A
// rough guess is enough: it helps someone recognise their own devices, and decides nothing.

const BROWSERS: [RegExp, string][] = [
  [/Edg(e|A|iOS)?\//, "Edge"],
  [/OPR\/|Opera/, "Opera"],
  [/Firefox\/|FxiOS\//, "Firefox"],
  [/Chrome\/|Chromium\/|CriOS\//, "Chrome"],
  [/Safari\//, "Safari"],
];

const SYSTEMS: [RegExp, string][] = [
  [/iPhone|iPad|iPod/, "iOS"],
  [/Android/, "Android"],
  [/Windows/, "Windows"],
  [/Mac OS X|Macintosh/, "macOS"],
  [/CrOS/, "ChromeOS"],
  [/Linux/, "Linux"],
];

/** "Firefox on Linux" from a user agent; the raw string (shortened) when it is none we know. */
export function describeBrowser(userAgent: string | null): string {
  if (!userAgent) return "Unknown browser";
  const browser = BROWSERS.find(([re]) => re.test(userAgent))?.[1];
  const system = SYSTEMS.find(([re]) => re.test(userAgent))?.[1];
  if (browser && system) return `${browser} on ${system}`;
  if (browser || system) return browser ?? `A browser on ${system}`;
  return userAgent.length > 60 ? `${userAgent.slice(0, 57)}…` : userAgent;
}
