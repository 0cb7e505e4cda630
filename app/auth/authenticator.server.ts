import { createCookie } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { CodeChallengeMethod, OAuth2RequestError, OAuth2Strategy } from "remix-auth-oauth2";
import { z } from "zod";
import { env } from "~/env.server";
import type { User } from "~/models/user.server";
import { passwordSignIn, SignInError, INVALID_CREDENTIALS } from "~/auth/accounts.server";
import { signInWithIdentity } from "~/auth/identities.server";
import { clientAddress } from "~/auth/rate-limit.server";
import { safeRedirect } from "~/auth/redirect";
import { SignInForm } from "~/auth/forms";

// remix-auth v4: `authenticate` only identifies the account; the routes start the session
// themselves (session.server.ts).
export const PASSWORD = "password";
export const LOADLINE_ID = "loadline-id";

export const authenticator = new Authenticator<User>();

authenticator.use(
  new FormStrategy(async ({ form, request }) => {
    const parsed = SignInForm.safeParse(Object.fromEntries(form));
    if (!parsed.success) throw new SignInError("invalid", INVALID_CREDENTIALS);
    return passwordSignIn(parsed.data.email, parsed.data.password, clientAddress(request));
  }),
  PASSWORD,
);

// --- OAuth sign-in ("Sign in with your Loadline pass") ---

const Discovery = z.object({
  authorization_endpoint: z.url(),
  token_endpoint: z.url(),
  userinfo_endpoint: z.url(),
});

const Profile = z.object({
  sub: z.string().min(1).max(255),
  email: z.email(),
  email_verified: z.union([z.boolean(), z.enum(["true", "false"]).transform((v) => v === "true")]).default(false),
  name: z.string().max(200).optional(),
});

const STATE_COOKIE = "loadline_oauth";
const CALLBACK_PATH = "/auth/oauth/callback";

let registered: Promise<void> | undefined;

/** Reads the provider's discovery document once and registers the strategy (retried after a failure). */
export function ensureOAuthStrategy(): Promise<void> {
  registered ??= registerOAuth().catch((error) => {
    registered = undefined;
    throw error;
  });
  return registered;
}

async function registerOAuth() {
  const { oauth, appUrl, secureCookies } = env();
  const answer = await fetch(new URL(".well-known/openid-configuration", oauth.issuer.replace(/\/?$/, "/")), {
    headers: { Accept: "application/json" },
    signal: AbortSignal.timeout(5_000),
  });
  if (!answer.ok) throw new Error(`OAuth discovery at ${oauth.issuer} answered ${answer.status}`);
  const doc = Discovery.parse(await answer.json());

  const strategy = new OAuth2Strategy<User>(
    {
      cookie: {
        name: STATE_COOKIE,
        path: "/auth/oauth",
        httpOnly: true,
        sameSite: "Lax",
        maxAge: 10 * 60,
        ...(secureCookies ? { secure: true as const } : {}),
      },
      clientId: oauth.clientId,
      clientSecret: oauth.clientSecret,
      authorizationEndpoint: doc.authorization_endpoint,
      tokenEndpoint: doc.token_endpoint,
      redirectURI: new URL(CALLBACK_PATH, appUrl).href,
      scopes: ["openid", "email", "profile"],
      codeChallengeMethod: CodeChallengeMethod.S256,
    },
    async ({ tokens }) => {
      // The profile comes from the provider's userinfo endpoint over the back channel with the
      // fresh access token, never from anything the browser carried.
      const res = await fetch(doc.userinfo_endpoint, {
        headers: { Authorization: `Bearer ${tokens.accessToken()}`, Accept: "application/json" },
        signal: AbortSignal.timeout(5_000),
      });
      if (!res.ok) throw new Error(`userinfo answered ${res.status}`);
      const profile = Profile.parse(await res.json());
      return signInWithIdentity({
        provider: LOADLINE_ID,
        subject: profile.sub,
        email: profile.email,
        emailVerified: profile.email_verified,
        name: profile.name,
      });
    },
  );
  authenticator.use(strategy, LOADLINE_ID);
}

// Where to go after the provider sends the browser back; signed so it cannot be swapped in transit.
const returnCookie = createCookie("loadline_return_to", {
  path: "/auth/oauth",
  httpOnly: true,
  sameSite: "lax",
  maxAge: 10 * 60,
  secure: env().secureCookies,
  secrets: env().sessionSecrets,
});

/** Starts OAuth sign-in: the redirect to the provider, with the return path remembered. */
export async function startOAuth(request: Request, redirectTo: string): Promise<Response> {
  await ensureOAuthStrategy();
  try {
    await authenticator.authenticate(LOADLINE_ID, request);
  } catch (thrown) {
    if (thrown instanceof Response) {
      thrown.headers.append("Set-Cookie", await returnCookie.serialize(safeRedirect(redirectTo)));
      return thrown;
    }
    throw thrown;
  }
  throw new Error("OAuth start did not redirect to the provider");
}

export type OAuthOutcome =
  | { ok: true; user: User; redirectTo: string; clearCookies: string[] }
  | { ok: false; code: "cancelled" | "failed" | "unverified" | "suspended"; error?: unknown; clearCookies: string[] };

/** Finishes OAuth sign-in at the callback. The one-time state cookies are cleared either way. */
export async function finishOAuth(request: Request): Promise<OAuthOutcome> {
  const clearCookies = expireOAuthCookies(request);
  clearCookies.push(await returnCookie.serialize("", { maxAge: 0 }));
  const redirectTo = safeRedirect(await returnCookie.parse(request.headers.get("Cookie")));
  try {
    await ensureOAuthStrategy();
    const user = await authenticator.authenticate(LOADLINE_ID, request);
    return { ok: true, user, redirectTo, clearCookies };
  } catch (error) {
    if (error instanceof SignInError) {
      const code = error.code === "suspended" ? "suspended" : error.code === "oauth_unverified" ? "unverified" : "failed";
      return { ok: false, code, clearCookies };
    }
    if (error instanceof OAuth2RequestError && error.code === "access_denied") {
      return { ok: false, code: "cancelled", clearCookies };
    }
    return { ok: false, code: "failed", error, clearCookies };
  }
}

function expireOAuthCookies(request: Request): string[] {
  const header = request.headers.get("Cookie") ?? "";
  const secure = env().secureCookies ? "; Secure" : "";
  return header
    .split(";")
    .map((part) => part.split("=")[0].trim())
    .filter((name) => name.startsWith(`${STATE_COOKIE}:`))
    .map((name) => `${name}=; Path=/auth/oauth; Max-Age=0; HttpOnly; SameSite=Lax${secure}`);
}
