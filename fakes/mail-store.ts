import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";

// Messages the catcher has received, newest first; optionally mirrored to a JSON file so a restart
// of `npm start` keeps the inbox.

export interface CaughtMessage {
  id: string;
  receivedAt: string;
  envelope: { from: string; to: string[] };
  from: string;
  to: string[];
  cc: string[];
  subject: string;
  messageId: string | null;
  date: string | null;
  text: string;
  html: string | null;
  headers: Record<string, string>;
  /** Every http(s) link found in the text and HTML parts, in order, without duplicates. */
  links: string[];
  size: number;
}

const MAX_MESSAGES = 1000;

export class MailStore {
  private messages: CaughtMessage[] = [];

  constructor(private readonly file?: string) {
    if (file && existsSync(file)) {
      try {
        const parsed = JSON.parse(readFileSync(file, "utf8"));
        if (Array.isArray(parsed)) this.messages = parsed;
      } catch {
        // A damaged inbox file is not worth refusing to start over; it is rewritten on the next mail.
      }
    }
  }

  add(message: Omit<CaughtMessage, "id" | "receivedAt">): CaughtMessage {
    const stored: CaughtMessage = { id: randomBytes(8).toString("hex"), receivedAt: new Date().toISOString(), ...message };
    this.messages.unshift(stored);
    this.messages.length = Math.min(this.messages.length, MAX_MESSAGES);
    this.save();
    return stored;
  }

  list(filter: { to?: string } = {}): CaughtMessage[] {
    const to = filter.to?.trim().toLowerCase();
    if (!to) return [...this.messages];
    return this.messages.filter((m) => [...m.envelope.to, ...m.to, ...m.cc].some((addr) => addr.toLowerCase() === to));
  }

  get(id: string): CaughtMessage | undefined {
    return this.messages.find((m) => m.id === id);
  }

  remove(id: string): boolean {
    const before = this.messages.length;
    this.messages = this.messages.filter((m) => m.id !== id);
    this.save();
    return this.messages.length < before;
  }

  clear(): void {
    this.messages = [];
    this.save();
  }

  private save(): void {
    if (!this.file) return;
    mkdirSync(path.dirname(this.file), { recursive: true });
    const tmp = `${this.file}.tmp`;
    writeFileSync(tmp, JSON.stringify(this.messages));
    renameSync(tmp, this.file);
  }
}

const LINK = /https?:\/\/[^\s<>"'()]+[^\s<>"'().,;:!?]/g;

export function extractLinks(text: string, html: string | null): string[] {
  const found: string[] = [];
  for (const m of text.matchAll(LINK)) found.push(m[0]);
  if (html) {
    for (const m of html.matchAll(/href\s*=\s*(?:"([^"]*)"|'([^']*)')/gi)) {
      const href = decodeEntities(m[1] ?? m[2] ?? "");
      if (/^https?:\/\//i.test(href)) found.push(href);
    }
  }
  return [...new Set(found)];
}

function decodeEntities(s: string): string {
  return s
    .replace(/&amp;/g, "&")
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">");
}
