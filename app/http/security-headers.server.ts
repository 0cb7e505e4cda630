import { randomBytes } from "node:crypto";

// The security headers every response carries, and the Content-Security-Policy of HTML documents.
// scripts/serve.ts adds the common ones to every response (JSON, media, static files);
// app/entry.server.tsx adds them and the policy to documents (the dev server has no serve.ts).
// No path aliases here: scripts/serve.ts imports this file outside Vite.

/** Browser features Loadline never uses, switched off for the page and anything it embeds. */
const UNUSED_FEATURES = [
  "accelerometer",
  "camera",
  "display-capture",
  "geolocation",
  "gyroscope",
  "hid",
  "magnetometer",
  "microphone",
  "midi",
  "payment",
  "serial",
  "usb",
];

/** Headers for any response. HSTS only when the public address is https (never on plain http). */
export function commonSecurityHeaders({ https }: { https: boolean }): [string, string][] {
  const headers: [string, string][] = [
    ["X-Content-Type-Options", "nosniff"],
    ["Referrer-Policy", "strict-origin-when-cross-origin"],
    ["Permissions-Policy", UNUSED_FEATURES.map((f) => `${f}=()`).join(", ")],
    // frame-ancestors in the policy does this for current browsers; this is for older ones.
    ["X-Frame-Options", "DENY"],
    ["Cross-Origin-Opener-Policy", "same-origin"],
  ];
  if (https) headers.push(["Strict-Transport-Security", "max-age=31536000; includeSubDomains"]);
  return headers;
}

/** A fresh nonce for one document's inline scripts (128 random bits). */
export function newNonce(): string {
  return randomBytes(16).toString("base64");
}

export interface PolicyOptions {
  nonce: string;
  /** Origins a form may post or be redirected to besides this site (the OAuth provider). */
  formTargets?: string[];
  https?: boolean;
  /** Vite's dev server: its client injects <style> elements and talks to HMR over a WebSocket. */
  dev?: boolean;
}

/**
 * The document policy: scripts only from this site or inline with this response's nonce; no
 * plugins, no <base>, no framing. Style attributes are allowed (React and the plots set them);
 * style elements only from this site (CSP3 browsers; older ones fall back to style-src).
 */
export function contentSecurityPolicy({ nonce, formTargets = [], https = false, dev = false }: PolicyOptions): string {
  const directives: Record<string, string[]> = {
    "default-src": ["'self'"],
    "script-src": ["'self'", `'nonce-${nonce}'`],
    "style-src": ["'self'", "'unsafe-inline'"],
    "style-src-elem": dev ? ["'self'", "'unsafe-inline'"] : ["'self'"],
    "style-src-attr": ["'unsafe-inline'"],
    "img-src": ["'self'", "data:", "blob:"],
    "font-src": ["'self'", "data:"],
    "connect-src": dev ? ["'self'", "ws:", "wss:"] : ["'self'"],
    "media-src": ["'self'", "blob:"],
    "worker-src": ["'self'", "blob:"],
    "object-src": ["'none'"],
    "base-uri": ["'none'"],
    "form-action": ["'self'", ...formTargets],
    "frame-src": ["'none'"],
    "frame-ancestors": ["'none'"],
  };
  const policy = Object.entries(directives).map(([name, values]) => `${name} ${values.join(" ")}`);
  if (https) policy.push("upgrade-insecure-requests");
  return policy.join("; ");
}
