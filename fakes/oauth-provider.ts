import { OAuth2Server, type MutableResponse, type MutableToken } from "oauth2-mock-server";
import { createHash } from "node:crypto";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import { z } from "zod";
import { close, listen, readBody, redirect, sendHtml, sendJson } from "./http";
import { badRequestPage, signInPage } from "./oauth-pages";
import {
  loadOrCreateKey,
  nameFromEmail,
  oauthEndpoints,
  pick,
  proxy,
  safeDecode,
  sameText,
  subjectFor,
  type OAuthEndpoints,
} from "./oauth-support";

export { nameFromEmail, oauthEndpoints, subjectFor, type OAuthEndpoints };

// Local OpenID provider. oauth2-mock-server issues the tokens and serves discovery, JWKS and
// userinfo; in front of it sits our own server that adds what the mock leaves out: a screen to
// choose who signs in, client authentication, an exact redirect_uri match, single-use codes and a
// PKCE (S256) check on every code exchange.

export interface OAuthIdentity {
  sub: string;
  email: string;
  email_verified: true;
  name: string;
}

export interface OAuthProviderOptions {
  port: number;
  host?: string;
  clientId: string;
  clientSecret: string;
  /** The only redirect_uri accepted, e.g. `${APP_URL}/auth/oauth/callback`. */
  redirectUri: string;
  /** Offered on the sign-in screen as one-click choices (the demo accounts); a function is asked on each visit. */
  suggestions?: Suggestions;
  /** Keeps the signing key across restarts; a fresh key each start when absent. */
  keyFile?: string;
}

export type Suggestions = { email: string; name: string }[] | (() => { email: string; name: string }[]);

export interface RunningOAuthProvider {
  issuer: string;
  endpoints: OAuthEndpoints;
  stop: () => Promise<void>;
}

interface PendingCode {
  identity: OAuthIdentity;
  clientId: string;
  redirectUri: string;
  challenge: string;
  scope: string;
  expiresAt: number;
}

const CODE_TTL_MS = 5 * 60_000;
const Email = z.email();

export async function startOAuthProvider(opts: OAuthProviderOptions): Promise<RunningOAuthProvider> {
  const host = opts.host ?? "127.0.0.1";
  const mock = new OAuth2Server();
  await loadOrCreateKey(mock, opts.keyFile);

  const codes = new Map<string, PendingCode>(); // issued, not yet exchanged
  const exchanging = new Map<string, PendingCode>(); // validated, the mock is minting tokens
  const accessTokens = new Map<string, OAuthIdentity>();
  const refreshTokens = new Map<string, { identity: OAuthIdentity; clientId: string; scope: string }>();
  const refreshing = new Map<string, { identity: OAuthIdentity; clientId: string; scope: string }>();
  let internal = "";

  const service = mock.service;
  service.on("beforeTokenSigning", (token: MutableToken, req: { body?: Record<string, string> }) => {
    const grant = req.body?.code ? exchanging.get(req.body.code) : refreshing.get(req.body?.refresh_token ?? "");
    if (!grant) return;
    Object.assign(token.payload, grant.identity);
    if ("scope" in token.payload) token.payload.scope = grant.scope; // access token, not the id_token
  });
  service.on("beforeResponse", (response: MutableResponse, req: { body?: Record<string, string> }) => {
    const code = req.body?.code;
    const oldRefresh = req.body?.refresh_token;
    const grant = code ? exchanging.get(code) : oldRefresh ? refreshing.get(oldRefresh) : undefined;
    if (code) exchanging.delete(code);
    if (oldRefresh) refreshing.delete(oldRefresh);
    if (!grant || response.statusCode !== 200 || typeof response.body !== "object") return;
    const body = response.body;
    body.scope = grant.scope;
    accessTokens.set(String(body.access_token), grant.identity);
    refreshTokens.set(String(body.refresh_token), {
      identity: grant.identity,
      clientId: grant.clientId,
      scope: grant.scope,
    });
  });
  service.on("beforeUserinfo", (response: MutableResponse, req: IncomingMessage) => {
    const token = /^Bearer\s+(.+)$/i.exec(req.headers.authorization ?? "")?.[1];
    const identity = token ? accessTokens.get(token) : undefined;
    if (!identity) {
      response.statusCode = 401;
      response.body = { error: "invalid_token", error_description: "unknown or missing access token" };
      return;
    }
    response.body = { ...identity };
  });

  function checkClientAndRedirect(p: URLSearchParams): string | null {
    if (p.get("client_id") !== opts.clientId) return `Unknown client_id "${p.get("client_id") ?? ""}".`;
    if (p.get("redirect_uri") !== opts.redirectUri) {
      return `redirect_uri "${p.get("redirect_uri") ?? ""}" is not registered for this client.`;
    }
    return null;
  }

  // Errors that may go back to the app (RFC 6749 §4.1.2.1); null when the request may proceed.
  function checkAuthorizeParams(p: URLSearchParams): { error: string; description: string } | null {
    if (p.get("response_type") !== "code") {
      return { error: "unsupported_response_type", description: "only response_type=code is supported" };
    }
    if (!p.get("state")) return { error: "invalid_request", description: "state is required" };
    if (!p.get("code_challenge") || p.get("code_challenge_method") !== "S256") {
      return { error: "invalid_request", description: "PKCE with code_challenge_method=S256 is required" };
    }
    return null;
  }

  function backToApp(res: ServerResponse, p: URLSearchParams, error: string, description: string): void {
    const url = new URL(p.get("redirect_uri")!);
    url.searchParams.set("error", error);
    url.searchParams.set("error_description", description);
    if (p.get("state")) url.searchParams.set("state", p.get("state")!);
    redirect(res, url.href, 302);
  }

  const AUTH_PARAMS = ["response_type", "client_id", "redirect_uri", "scope", "state", "code_challenge", "code_challenge_method", "nonce"];
  const carried = (p: URLSearchParams) => Object.fromEntries(AUTH_PARAMS.filter((k) => p.get(k) !== null).map((k) => [k, p.get(k)!]));

  async function authorize(req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
    const p = req.method === "POST" ? new URLSearchParams((await readBody(req)).toString("utf8")) : url.searchParams;
    const bad = checkClientAndRedirect(p);
    if (bad) return sendHtml(res, 400, badRequestPage(bad));
    const wrong = checkAuthorizeParams(p);
    if (wrong) return backToApp(res, p, wrong.error, wrong.description);
    const suggestions = (typeof opts.suggestions === "function" ? opts.suggestions() : opts.suggestions) ?? [];
    if (req.method !== "POST") return sendHtml(res, 200, signInPage({ params: carried(p), suggestions }));

    if (p.get("action") === "deny") return backToApp(res, p, "access_denied", "the person cancelled sign-in");
    const email = (p.get("pick") || p.get("email") || "").trim().toLowerCase();
    const typedName = (p.get("pick") ? "" : p.get("name") || "").trim();
    if (!Email.safeParse(email).success) {
      const error = email ? "Enter a valid e-mail address, like name@example.test." : "Enter the e-mail address to sign in as.";
      return sendHtml(res, 422, signInPage({ params: carried(p), suggestions, email, name: typedName, error }));
    }
    const name = typedName || suggestions.find((s) => s.email.toLowerCase() === email)?.name || nameFromEmail(email);
    const identity: OAuthIdentity = { sub: subjectFor(email), email, email_verified: true, name };

    // The mock's own authorize step issues the code (and remembers the challenge and nonce).
    const forward = new URL(`${internal}/authorize`);
    for (const [k, v] of Object.entries(carried(p))) forward.searchParams.set(k, v);
    const answer = await fetch(forward, { redirect: "manual" });
    const location = answer.headers.get("location");
    const code = location ? new URL(location).searchParams.get("code") : null;
    if (!location || !code) throw new Error(`identity provider mock answered ${answer.status} without a code`);
    codes.set(code, {
      identity,
      clientId: opts.clientId,
      redirectUri: p.get("redirect_uri")!,
      challenge: p.get("code_challenge")!,
      scope: p.get("scope") ?? "openid",
      expiresAt: Date.now() + CODE_TTL_MS,
    });
    redirect(res, location, 302);
  }

  function clientOf(req: IncomingMessage, body: URLSearchParams): { id: string; secret: string } | null {
    const basic = /^Basic\s+(.+)$/i.exec(req.headers.authorization ?? "")?.[1];
    if (basic) {
      const decoded = Buffer.from(basic, "base64").toString("utf8");
      const i = decoded.indexOf(":");
      if (i < 0) return null;
      return { id: safeDecode(decoded.slice(0, i)), secret: safeDecode(decoded.slice(i + 1)) };
    }
    const id = body.get("client_id");
    const secret = body.get("client_secret");
    return id && secret ? { id, secret } : null;
  }

  async function token(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const raw = await readBody(req);
    const body = new URLSearchParams(raw.toString("utf8"));
    const client = clientOf(req, body);
    if (!client || client.id !== opts.clientId || !sameText(client.secret, opts.clientSecret)) {
      return sendJson(
        res,
        401,
        { error: "invalid_client", error_description: "client authentication failed" },
        {
          "www-authenticate": 'Basic realm="loadline-local"',
        },
      );
    }
    const grantType = body.get("grant_type");
    if (grantType === "authorization_code") {
      const code = body.get("code") ?? "";
      const pending = codes.get(code);
      codes.delete(code); // single use, whatever happens next
      const invalid = (description: string) => sendJson(res, 400, { error: "invalid_grant", error_description: description });
      if (!pending || pending.expiresAt < Date.now()) return invalid("unknown, used or expired code");
      if (pending.clientId !== client.id) return invalid("code was issued to another client");
      if (body.get("redirect_uri") !== pending.redirectUri) return invalid("redirect_uri does not match the authorization request");
      const verifier = body.get("code_verifier") ?? "";
      if (!/^[A-Za-z0-9\-._~]{43,128}$/.test(verifier)) return invalid("code_verifier missing or malformed (RFC 7636 §4.1)");
      const challenge = createHash("sha256").update(verifier).digest("base64url");
      if (!sameText(challenge, pending.challenge)) return invalid("code_verifier does not match code_challenge");
      exchanging.set(code, pending);
    } else if (grantType === "refresh_token") {
      const old = body.get("refresh_token") ?? "";
      const grant = refreshTokens.get(old);
      refreshTokens.delete(old);
      if (!grant || grant.clientId !== client.id) {
        return sendJson(res, 400, { error: "invalid_grant", error_description: "unknown refresh token" });
      }
      refreshing.set(old, grant);
    } else {
      return sendJson(res, 400, { error: "unsupported_grant_type" });
    }
    const forwarded = new URLSearchParams(body);
    forwarded.set("client_id", client.id);
    forwarded.delete("client_secret");
    await proxy(res, `${internal}/token`, { method: "POST", body: forwarded, headers: {} });
  }

  async function discovery(res: ServerResponse): Promise<void> {
    const doc = (await (await fetch(`${internal}/.well-known/openid-configuration`)).json()) as Record<string, unknown>;
    sendJson(res, 200, {
      ...doc,
      token_endpoint_auth_methods_supported: ["client_secret_basic", "client_secret_post"],
      grant_types_supported: ["authorization_code", "refresh_token"],
      code_challenge_methods_supported: ["S256"],
      scopes_supported: ["openid", "email", "profile"],
      claims_supported: ["sub", "email", "email_verified", "name"],
    });
  }

  const front = createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://idp.local");
    const route = `${req.method} ${url.pathname}`;
    const work = (() => {
      switch (route) {
        case "GET /.well-known/openid-configuration":
          return discovery(res);
        case "GET /authorize":
        case "POST /authorize":
          return authorize(req, res, url);
        case "POST /token":
          return token(req, res);
        case "GET /userinfo":
        case "GET /jwks":
          return proxy(res, `${internal}${url.pathname}`, { method: "GET", headers: pick(req, ["authorization"]) });
        default:
          return Promise.resolve(sendJson(res, 404, { error: "not_found" }));
      }
    })();
    work.catch((err: Error) => {
      if (!res.headersSent) sendJson(res, 500, { error: "server_error", error_description: err.message });
    });
  });

  const port = await listen(front, opts.port, host);
  const issuer = `http://${host}:${port}`;
  mock.issuer.url = issuer; // tokens name the public address, not the mock's own port
  await mock.start(0, "127.0.0.1");
  internal = `http://127.0.0.1:${mock.address().port}`;

  return {
    issuer,
    endpoints: oauthEndpoints(issuer),
    async stop() {
      await close(front);
      if (mock.listening) await mock.stop();
    },
  };
}
