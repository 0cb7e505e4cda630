import { randomBytes } from "node:crypto";

// Shared by the auth integration suites: unique addresses per run, so suites never collide with
// each other, the demo data or a previous run, and can clean up exactly what they made.
export const RUN = randomBytes(4).toString("hex");

export function testEmail(label: string): string {
  return `auth-it-${RUN}-${label}@example.test`;
}

export const TEST_EMAIL_PATTERN = `auth-it-${RUN}-%@example.test`;

export interface SentMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

/** The path+token of the first link to `prefix` in a captured message. */
export function linkToken(mail: SentMail | undefined, prefix: string): string {
  const match = mail?.text.match(new RegExp(`https?://[^\\s]+${prefix}([A-Za-z0-9_-]+)`));
  if (!match) throw new Error(`no ${prefix} link in ${mail?.subject ?? "(no mail)"}`);
  return match[1];
}
