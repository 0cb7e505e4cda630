import type { Answer, Body } from "./http";
import type { Fixtures, Persona } from "./matrix-fixtures";

// The language of the authorization matrix: what each persona should get from each address, and
// how an answer is judged against it.

/**
 * - `"ok"`: 2xx (the page or data is served)
 * - `"sign-in"`: sent to sign in and back: a redirect to `/sign-in?redirectTo=<the path asked for>`
 * - `{ to }`: a redirect elsewhere (a path with `:params` filled in, or a pattern)
 * - a number: exactly that status (400 = let in, and the probe's input refused; 401/403/404/405/410)
 * - `{ anyOf }`: any of these (where React Router's loader order decides between two right answers)
 */
export type Outcome = "ok" | "sign-in" | { to: string | RegExp } | number | { anyOf: Outcome[] };

/** Outcomes by persona; `others` covers every persona not named. */
export type ByPersona = Partial<Record<Persona | "others", Outcome>>;

export type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
export const METHODS: readonly Method[] = ["GET", "POST", "PUT", "PATCH", "DELETE"];

export interface Write {
  body?: (f: Fixtures) => Body;
  expect: ByPersona;
  /** The owner's request changes what the others see (it deletes the fixture): it runs after all others. */
  last?: boolean;
  /** Needs its own session (it ends the one it is sent with). */
  fresh?: boolean;
}

export interface Case {
  /** Shown in failures when a route has several cases ("held listing"). */
  name?: string;
  params?: (f: Fixtures) => Record<string, string>;
  /** Page: the document and its `.data`; resource route: GET. */
  get?: ByPersona;
  /** Page action: POST to the page (sent as single fetch for each persona, as a plain form by the anonymous one). */
  post?: Write;
  /** Resource routes: the writes they take. Any method not named must answer 405. */
  writes?: Partial<Record<Exclude<Method, "GET">, Write>>;
}

export interface Entry {
  cases: Case[];
  /** A route another change is adding: its entry is ready, and absent from app/routes.ts is no failure. */
  upcoming?: boolean;
}

// Shorthands for the rows that repeat.
export const everyone = (o: Outcome): ByPersona => ({ others: o });
/** Pages that need an account: visitors go to sign in and come back. */
export const signedIn = (o: Outcome): ByPersona => ({ anonymous: "sign-in", others: o });
/** The owner's own records (pages): everyone else gets the same 404 as for a record that does not exist. */
export const ownerOnly = (o: Outcome = "ok"): ByPersona => ({ anonymous: "sign-in", owner: o, others: 404 });
/** API routes that need an account answer 401 instead of redirecting. */
export const apiSignedIn = (o: Outcome): ByPersona => ({ anonymous: 401, others: o });
export const apiOwnerOnly = (o: Outcome = "ok"): ByPersona => ({ anonymous: 401, owner: o, others: 404 });

export function outcomeFor(row: ByPersona, persona: Persona): Outcome | undefined {
  return row[persona] ?? row.others;
}

/** The outcome for `persona`; the table check has already reported rows that leave one out. */
export function outcomeOf(row: ByPersona, persona: Persona): Outcome {
  const o = outcomeFor(row, persona);
  if (o === undefined) throw new Error(`no outcome for ${persona}`);
  return o;
}

export function describeOutcome(o: Outcome): string {
  if (o === "ok") return "2xx";
  if (o === "sign-in") return "redirect to sign in and back";
  if (typeof o === "number") return String(o);
  if ("anyOf" in o) return o.anyOf.map(describeOutcome).join(" or ");
  return `redirect to ${o.to}`;
}

export function describeAnswer(a: Answer): string {
  const where = a.location ?? a.dataRedirect;
  const body = where ? "" : ` ${a.text.replace(/\s+/g, " ").slice(0, 160)}`;
  return `${a.status}${where ? ` → ${where}` : ""}${a.contentType.includes("html") ? " (html)" : body}`;
}

/** Where an answer redirects: a plain 3xx Location, or a single-fetch 202 payload for `.data`. */
function redirectOf(a: Answer, viaData: boolean): string | null {
  if (viaData) return a.status === 202 ? a.dataRedirect : null;
  return a.status >= 300 && a.status < 400 ? a.location : null;
}

/** Whether `answer` to a request for `path` is `expected`; `fill` turns `:param`s in redirect targets into values. */
export function matches(expected: Outcome, answer: Answer, path: string, viaData: boolean, fill: (p: string) => string): boolean {
  if (typeof expected === "object" && "anyOf" in expected) return expected.anyOf.some((o) => matches(o, answer, path, viaData, fill));
  const to = redirectOf(answer, viaData);
  if (expected === "ok") return answer.status >= 200 && answer.status < 300 && !(viaData && answer.dataRedirect);
  if (expected === "sign-in") {
    if (!to) return false;
    const url = new URL(to, "http://app.invalid");
    return url.origin === "http://app.invalid" && url.pathname === "/sign-in" && url.searchParams.get("redirectTo") === path;
  }
  if (typeof expected === "number") return answer.status === expected;
  if (!to) return false;
  return typeof expected.to === "string" ? to === fill(expected.to) : expected.to.test(to);
}

/** API errors come in one shape: `{ error: "lower_snake_code", message: "…" }` (plus `issues` for input). */
export function apiErrorShapeProblem(answer: Answer): string | null {
  if (!answer.contentType.includes("application/json")) return `content-type ${answer.contentType || "(none)"}, not JSON`;
  let body: unknown;
  try {
    body = JSON.parse(answer.text);
  } catch {
    return "a body that is not JSON";
  }
  if (!body || typeof body !== "object" || Array.isArray(body)) return `body ${answer.text.slice(0, 120)}`;
  const error: unknown = "error" in body ? body.error : undefined;
  const message: unknown = "message" in body ? body.message : undefined;
  if (typeof error !== "string" || !/^[a-z][a-z0-9_]*$/.test(error)) return `"error" is ${JSON.stringify(error)}, not a lower_snake code`;
  if (typeof message !== "string" || !message.trim()) return `"message" is ${JSON.stringify(message)}, not a sentence`;
  return null;
}
