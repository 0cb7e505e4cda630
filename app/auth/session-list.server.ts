import { listOpenSessions } from "~/auth/session-store.server";
import { describeBrowser } from "~/auth/browser-name";
import { momentText } from "@shared/dates";

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
const label = (d: Date) => momentText(d);

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
