// Reads the local mail catcher over its HTTP API (E2E_MAIL_URL), as a person would read their inbox.

export interface CaughtMail {
  id: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  links: string[];
  date: string | null;
}

export function mailUrl(): string {
  const url = process.env.E2E_MAIL_URL;
  if (!url) throw new Error("E2E_MAIL_URL is not set: run the browser suite through `npm test`.");
  return url.replace(/\/+$/, "");
}

export async function inbox(to: string): Promise<CaughtMail[]> {
  const res = await fetch(`${mailUrl()}/api/messages?${new URLSearchParams({ to })}`);
  if (!res.ok) throw new Error(`mail catcher answered ${res.status}`);
  return (await res.json()) as CaughtMail[];
}

/** Waits for a message to `to` (newest first) whose subject matches; polls the catcher. */
export async function waitForMail(
  to: string,
  { subject, timeoutMs = 20_000, after }: { subject?: RegExp; timeoutMs?: number; after?: string[] } = {},
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  const seen = new Set(after ?? []);
  for (;;) {
    const found = (await inbox(to)).find((m) => !seen.has(m.id) && (!subject || subject.test(m.subject)));
    if (found) return found;
    if (Date.now() > deadline) {
      throw new Error(`no mail to ${to}${subject ? ` matching ${subject}` : ""} within ${timeoutMs} ms`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The first link in a message whose path starts with `pathPrefix` (e.g. "/verify-email/"). */
export function extractLink(mail: CaughtMail, pathPrefix: string): string {
  const candidates = mail.links?.length ? mail.links : [...mail.text.matchAll(/https?:\/\/[^\s<>"']+/g)].map((m) => m[0]);
  const link = candidates.find((href) => {
    try {
      return new URL(href).pathname.startsWith(pathPrefix);
    } catch {
      return false;
    }
  });
  if (!link) throw new Error(`no ${pathPrefix} link in the mail "${mail.subject}"`);
  return link;
}
