import net from "node:net";
import { baseUrl } from "./browser";

// Plain HTTP against the served app, as a browser without scripts (or an attacker's tool) would talk
// to it: a cookie jar, redirects never followed, and same-origin Origin headers on writes.

export interface Answer {
  status: number;
  location: string | null;
  contentType: string;
  text: string;
  /** Where a single-fetch (`.data`) answer redirects to, read from its turbo-stream payload. */
  dataRedirect: string | null;
}

export type Body = { form: Record<string, string> } | { json: unknown } | { multipart: FormData } | { raw: BodyInit; type?: string };

export interface RequestOptions {
  body?: Body;
  headers?: Record<string, string>;
  /** Leave out the same-origin Origin header a browser sends with writes. */
  noOrigin?: boolean;
  signal?: AbortSignal;
}

export class Agent {
  private readonly jar = new Map<string, string>();

  constructor(readonly label: string) {}

  get signedIn(): boolean {
    return this.jar.size > 0;
  }

  get cookieHeader(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  async request(method: string, path: string, options: RequestOptions = {}): Promise<Answer> {
    const headers = new Headers(options.headers);
    if (this.jar.size && !headers.has("Cookie")) headers.set("Cookie", this.cookieHeader);
    if (method !== "GET" && method !== "HEAD" && !options.noOrigin && !headers.has("Origin")) headers.set("Origin", baseUrl());
    let body: BodyInit | undefined;
    const b = options.body;
    if (b && "form" in b) {
      body = new URLSearchParams(b.form);
      headers.set("Content-Type", "application/x-www-form-urlencoded");
    } else if (b && "json" in b) {
      body = JSON.stringify(b.json);
      headers.set("Content-Type", "application/json");
    } else if (b && "multipart" in b) {
      body = b.multipart;
    } else if (b && "raw" in b) {
      body = b.raw;
      if (b.type !== undefined) headers.set("Content-Type", b.type);
    }
    const res = await fetch(`${baseUrl()}${path}`, {
      method,
      headers,
      body,
      redirect: "manual",
      signal: options.signal ?? AbortSignal.timeout(30_000),
    });
    for (const line of res.headers.getSetCookie()) this.store(line);
    const text = method === "HEAD" ? "" : await res.text();
    const contentType = res.headers.get("Content-Type") ?? "";
    return {
      status: res.status,
      location: res.headers.get("Location"),
      contentType,
      text,
      dataRedirect: contentType.includes("text/x-script") ? singleFetchRedirect(text) : null,
    };
  }

  private store(line: string) {
    const [pair, ...attributes] = line.split(";");
    const eq = pair.indexOf("=");
    const name = pair.slice(0, eq).trim();
    const value = pair.slice(eq + 1).trim();
    const expired = attributes.some(
      (a) => /^\s*max-age\s*=\s*0\s*$/i.test(a) || (/^\s*expires\s*=/i.test(a) && Date.parse(a.split("=")[1]) < Date.now()),
    );
    if (expired || value === "") this.jar.delete(name);
    else this.jar.set(name, value);
  }
}

/**
 * The target of a single-fetch redirect. React Router answers a `.data` request whose loader or
 * action redirects with 202 and a turbo-stream payload: a flat array in which objects map `_<index
 * of key>` to `<index of value>`. Only the first line matters (redirects carry no promises).
 */
export function singleFetchRedirect(text: string): string | null {
  let flat: unknown;
  try {
    flat = JSON.parse(text.split("\n")[0]);
  } catch {
    return null;
  }
  if (!Array.isArray(flat)) return null;
  const key = flat.indexOf("redirect");
  if (key < 0) return null;
  for (const item of flat) {
    if (item && typeof item === "object" && !Array.isArray(item)) {
      const at: unknown = Object.getOwnPropertyDescriptor(item, `_${key}`)?.value;
      const target: unknown = typeof at === "number" ? flat[at] : undefined;
      if (typeof target === "string") return target;
    }
  }
  return null;
}

/** Signs in through the real /sign-in form; the agent keeps whatever cookie the app sets. */
export async function signIn(label: string, email: string, password: string): Promise<Agent> {
  const agent = new Agent(label);
  const res = await agent.request("POST", "/sign-in", { body: { form: { email, password, redirectTo: "/" } } });
  if (res.status !== 302 && res.status !== 303)
    throw new Error(`signing in ${label} (${email}) answered ${res.status}: ${res.text.slice(0, 300)}`);
  if (!agent.signedIn) throw new Error(`signing in ${label} (${email}) set no cookie`);
  return agent;
}

/** Runs `jobs` with at most `width` in flight; results in order. */
export async function inParallel<T>(jobs: (() => Promise<T>)[], width = 8): Promise<T[]> {
  const out = new Array<T>(jobs.length);
  let next = 0;
  async function lane() {
    while (next < jobs.length) {
      const i = next++;
      out[i] = await jobs[i]();
    }
  }
  await Promise.all(Array.from({ length: Math.min(width, jobs.length) }, lane));
  return out;
}

/**
 * Sends `head` + `body` over a bare socket (for what fetch refuses to send, such as a Content-Length
 * that does not match the body) and reads the first status line; null when none came within `waitMs`.
 */
export function rawExchange(head: string, body: Uint8Array, waitMs: number): Promise<number | null> {
  const url = new URL(baseUrl());
  return new Promise((resolve) => {
    const socket = net.connect(Number(url.port), url.hostname);
    let received = "";
    const done = (status: number | null) => {
      clearTimeout(timer);
      socket.destroy();
      resolve(status);
    };
    const timer = setTimeout(() => done(null), waitMs);
    socket.on("connect", () => {
      socket.write(head);
      socket.write(body);
    });
    socket.on("data", (chunk) => {
      received += chunk.toString("latin1");
      const line = /^HTTP\/1\.[01] (\d{3})/.exec(received);
      if (line) done(Number(line[1]));
    });
    socket.on("error", () => done(null));
    socket.on("close", () => done(null));
  });
}
