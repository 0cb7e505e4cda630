import type { OAuth2Server } from "oauth2-mock-server";
import { createHash, timingSafeEqual } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import type { IncomingMessage, ServerResponse } from "node:http";
import path from "node:path";

// Helpers of the local identity provider: endpoint URLs, stable subjects, proxying to the mock.

export interface OAuthEndpoints {
  discovery: string;
  authorization: string;
  token: string;
  userinfo: string;
  jwks: string;
}

export function oauthEndpoints(issuer: string): OAuthEndpoints {
  const base = issuer.replace(/\/+$/, "");
  return {
    discovery: `${base}/.well-known/openid-configuration`,
    authorization: `${base}/authorize`,
    token: `${base}/token`,
    userinfo: `${base}/userinfo`,
    jwks: `${base}/jwks`,
  };
}

/** Stable subject per address, so a returning person is recognised after a restart. */
export function subjectFor(email: string): string {
  return "lp-" + createHash("sha256").update(`loadline-local:${email.trim().toLowerCase()}`).digest("hex").slice(0, 24);
}

export function nameFromEmail(email: string): string {
  const local = email.split("@")[0] ?? email;
  return local
    .split(/[._+-]+/)
    .filter(Boolean)
    .map((w) => w[0].toUpperCase() + w.slice(1))
    .join(" ");
}

export async function proxy(res: ServerResponse, url: string, init: RequestInit & { headers: Record<string, string> }) {
  const answer = await fetch(url, { ...init, redirect: "manual" });
  const headers: Record<string, string> = {};
  for (const h of ["content-type", "cache-control", "pragma", "www-authenticate"]) {
    const v = answer.headers.get(h);
    if (v) headers[h] = v;
  }
  res.writeHead(answer.status, headers);
  res.end(Buffer.from(await answer.arrayBuffer()));
}

export function pick(req: IncomingMessage, names: string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const n of names) if (typeof req.headers[n] === "string") out[n] = req.headers[n];
  return out;
}

export function safeDecode(s: string): string {
  try {
    return decodeURIComponent(s.replace(/\+/g, " "));
  } catch {
    return s;
  }
}

export function sameText(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

export async function loadOrCreateKey(mock: OAuth2Server, keyFile?: string): Promise<void> {
  if (keyFile && existsSync(keyFile)) {
    await mock.issuer.keys.add(JSON.parse(readFileSync(keyFile, "utf8")));
    return;
  }
  const jwk = await mock.issuer.keys.generate("RS256");
  if (keyFile) {
    mkdirSync(path.dirname(keyFile), { recursive: true });
    writeFileSync(keyFile, JSON.stringify(jwk), { mode: 0o600 });
  }
}
