import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";
import { noSuch } from "./errors";

// The payments stand-in's whole state: Stripe objects by id (insertion order = creation order),
// saved idempotent responses and onboarding links. Kept in memory, mirrored to a JSON file.

export type StripeObject = { id: string; object: string; created: number; [key: string]: any };

export interface SavedResponse {
  fingerprint: string;
  status: number;
  body: unknown;
  requestId: string;
  savedAt: number;
}

export interface OnboardingLink {
  account: string;
  refreshUrl: string | null;
  returnUrl: string;
  expiresAt: number;
  used: boolean;
}

export interface RequestInfo {
  id: string | null;
  idempotency_key: string | null;
}

interface Persisted {
  objects: Record<string, StripeObject>;
  idempotency: Record<string, SavedResponse>;
  links: Record<string, OnboardingLink>;
}

const ALPHABET = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";

export function randomToken(length: number): string {
  const bytes = randomBytes(length);
  let out = "";
  for (let i = 0; i < length; i++) out += ALPHABET[bytes[i] % ALPHABET.length];
  return out;
}

export class StripeStore {
  objects: Record<string, StripeObject> = {};
  idempotency: Record<string, SavedResponse> = {};
  links: Record<string, OnboardingLink> = {};
  private listeners: ((event: StripeObject) => void)[] = [];
  private saveTimer: NodeJS.Timeout | null = null;

  constructor(
    readonly apiVersion: string,
    private readonly file?: string,
    readonly clock: () => number = () => Math.floor(Date.now() / 1000),
  ) {
    if (file && existsSync(file)) {
      try {
        const saved = JSON.parse(readFileSync(file, "utf8")) as Persisted;
        this.objects = saved.objects ?? {};
        this.idempotency = saved.idempotency ?? {};
        this.links = saved.links ?? {};
      } catch {
        // Unreadable state starts afresh rather than blocking `npm start`.
      }
    }
  }

  now(): number {
    return this.clock();
  }

  newId(prefix: string, length = 24): string {
    return `${prefix}_${randomToken(length)}`;
  }

  insert<T extends StripeObject>(obj: T): T {
    this.objects[obj.id] = obj;
    this.changed();
    return obj;
  }

  get(id: string | null | undefined): StripeObject | undefined {
    return id ? this.objects[id] : undefined;
  }

  /** The object, or Stripe's 404 naming it. */
  find(id: string, object: string, noun: string, param = "id"): StripeObject {
    const found = this.objects[id];
    if (!found || found.object !== object || found.deleted) throw noSuch(noun, id, param);
    return found;
  }

  /** Newest first. */
  all(object: string): StripeObject[] {
    return Object.values(this.objects)
      .filter((o) => o.object === object && !o.deleted)
      .reverse();
  }

  onEvent(listener: (event: StripeObject) => void): void {
    this.listeners.push(listener);
  }

  /** Records an event with a snapshot of the object and hands it to the webhook sender. */
  emit(type: string, obj: StripeObject, request: RequestInfo, previous?: Record<string, unknown>, account?: string | null): StripeObject {
    const event: StripeObject = {
      id: this.newId("evt"),
      object: "event",
      ...(account ? { account } : {}),
      api_version: this.apiVersion,
      created: this.now(),
      data: { object: publicView(obj), ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: 0,
      request,
      type,
    };
    this.insert(event);
    for (const l of this.listeners) l(event);
    return event;
  }

  changed(): void {
    if (!this.file || this.saveTimer) return;
    this.saveTimer = setTimeout(() => this.flush(), 50);
    this.saveTimer.unref();
  }

  flush(): void {
    if (this.saveTimer) clearTimeout(this.saveTimer);
    this.saveTimer = null;
    if (!this.file) return;
    const dayAgo = Date.now() - 24 * 3600_000; // Stripe may prune keys after 24 h
    for (const [k, v] of Object.entries(this.idempotency)) if (v.savedAt < dayAgo) delete this.idempotency[k];
    mkdirSync(path.dirname(this.file), { recursive: true });
    const data: Persisted = { objects: this.objects, idempotency: this.idempotency, links: this.links };
    writeFileSync(`${this.file}.tmp`, JSON.stringify(data));
    renameSync(`${this.file}.tmp`, this.file);
  }
}

/** What the API shows: a deep copy without the stand-in's own `_`-prefixed bookkeeping. */
export function publicView<T extends StripeObject>(obj: T): T {
  const copy = structuredClone(obj);
  for (const key of Object.keys(copy)) if (key.startsWith("_")) delete copy[key];
  return copy;
}

/** Stripe's cursor pagination over a newest-first array. */
export function paginate(items: StripeObject[], url: string, q: { limit?: number; starting_after?: string; ending_before?: string }) {
  const limit = q.limit ?? 10;
  let start = 0;
  let end = items.length;
  if (q.starting_after) {
    const i = items.findIndex((o) => o.id === q.starting_after);
    if (i < 0) throw noSuch("object", q.starting_after, "starting_after");
    start = i + 1;
  } else if (q.ending_before) {
    const i = items.findIndex((o) => o.id === q.ending_before);
    if (i < 0) throw noSuch("object", q.ending_before, "ending_before");
    end = i;
    start = Math.max(0, end - limit);
  }
  const page = items.slice(start, Math.min(end, start + limit));
  const hasMore = q.ending_before ? start > 0 : start + limit < end;
  return { object: "list", data: page.map(publicView), has_more: hasMore, url };
}
