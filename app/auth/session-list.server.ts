import { listOpenSessions } from "~/auth/session-store.server";

// What /account shows of an account's open sessions. Only the row id leaves the server (the forms
// post it back); the token never does.

export interface SessionRow {
  id: string;
  browser: string;
  address: string | null;
  signedInAt: string;
  signedInLabel: string;
  lastSeenAt: string;
  lastSeenLabel: string;
  current: boolean;
}

// Formatted here, in UTC, so the page reads the same on the server and after hydration.
const when = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });
const label = (d: Date) => `${when.format(d)} UTC`;

export async function sessionList(userId: string, currentSessionId: string): Promise<SessionRow[]> {
  const rows = await listOpenSessions(userId);
  const list = rows.map((s) => ({
    id: s.id,
    browser: describeBrowser(s.userAgent),
    address: s.address,
    signedInAt: s.createdAt.toISOString(),
    signedInLabel: label(s.createdAt),
    lastSeenAt: s.lastSeenAt.toISOString(),
    lastSeenLabel: label(s.lastSeenAt),
    current: s.id === currentSessionId,
  }));
  // This device first, then the most recently used.
  return [...list.filter((s) => s.current), ...list.filter((s) => !s.current)];
}

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
