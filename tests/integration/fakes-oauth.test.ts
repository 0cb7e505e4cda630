import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash, randomBytes } from "node:crypto";
import { startOAuthProvider, subjectFor, type RunningOAuthProvider } from "../../fakes/oauth-provider";

// The local identity provider, driven with plain HTTP the way a browser and the app's
// remix-auth-oauth2 strategy drive it: authorize → our sign-in form → code → token (PKCE) → userinfo.
const CLIENT = { id: "loadline-local", secret: "loadline-local-secret" };
const REDIRECT = "http://127.0.0.1:3999/auth/oauth/callback";

function pkce() {
  const verifier = randomBytes(32).toString("base64url");
  // RFC 7636 §4.2: code_challenge = BASE64URL(SHA256(ASCII(code_verifier))) for S256.
  return { verifier, challenge: createHash("sha256").update(verifier).digest("base64url") };
}

function decodeEntities(s: string) {
  return s
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&amp;/g, "&");
}

describe("local identity provider", () => {
  let idp: RunningOAuthProvider;
  beforeAll(async () => {
    idp = await startOAuthProvider({
      port: 0,
      clientId: CLIENT.id,
      clientSecret: CLIENT.secret,
      redirectUri: REDIRECT,
      suggestions: [{ email: "ines.halvard@example.test", name: "Ines Halvard" }],
    });
  });
  afterAll(() => idp?.stop());

  function authorizeUrl(challenge: string, overrides: Record<string, string> = {}) {
    const url = new URL(idp.endpoints.authorization);
    const params = {
      response_type: "code",
      client_id: CLIENT.id,
      redirect_uri: REDIRECT,
      scope: "openid email profile",
      state: "st-81f2",
      code_challenge: challenge,
      code_challenge_method: "S256",
      ...overrides,
    };
    for (const [k, v] of Object.entries(params)) url.searchParams.set(k, v);
    return url;
  }

  /** Opens the sign-in page, fills in the e-mail and submits the form as a browser would. */
  async function signInAs(challenge: string, email: string): Promise<URL> {
    const page = await fetch(authorizeUrl(challenge));
    expect(page.status).toBe(200);
    const html = await page.text();
    const form = /<form[^>]*method="post" action="([^"]+)"/.exec(html);
    expect(form).not.toBeNull();
    const fields = new URLSearchParams();
    for (const m of html.matchAll(/<input type="hidden" name="([^"]+)" value="([^"]*)"\s*\/?>/g)) fields.set(m[1], decodeEntities(m[2]));
    fields.set("email", email);
    fields.set("action", "allow");
    const submitted = await fetch(new URL(form![1], idp.issuer), { method: "POST", body: fields, redirect: "manual" });
    expect(submitted.status).toBe(302);
    return new URL(submitted.headers.get("location")!);
  }

  function exchange(code: string, verifier: string, auth = `Basic ${Buffer.from(`${CLIENT.id}:${CLIENT.secret}`).toString("base64")}`) {
    return fetch(idp.endpoints.token, {
      method: "POST",
      headers: { authorization: auth },
      body: new URLSearchParams({ grant_type: "authorization_code", code, redirect_uri: REDIRECT, code_verifier: verifier }),
    });
  }

  it("publishes discovery with S256 PKCE and secret-based client authentication", async () => {
    const doc = await (await fetch(idp.endpoints.discovery)).json();
    expect(doc).toMatchObject({
      issuer: idp.issuer,
      authorization_endpoint: idp.endpoints.authorization,
      token_endpoint: idp.endpoints.token,
      userinfo_endpoint: idp.endpoints.userinfo,
      code_challenge_methods_supported: ["S256"],
    });
    expect(doc.token_endpoint_auth_methods_supported).toContain("client_secret_basic");
  });

  it("signs a chosen person in with the authorization-code flow and PKCE", async () => {
    const { verifier, challenge } = pkce();
    const back = await signInAs(challenge, "Marta.Quell@example.test");
    expect(back.origin + back.pathname).toBe(REDIRECT);
    expect(back.searchParams.get("state")).toBe("st-81f2");
    const code = back.searchParams.get("code")!;

    const res = await exchange(code, verifier);
    expect(res.status).toBe(200);
    const tokens = await res.json();
    expect(tokens.token_type).toBe("Bearer");
    const idToken = JSON.parse(Buffer.from(tokens.id_token.split(".")[1], "base64url").toString());
    expect(idToken).toMatchObject({
      iss: idp.issuer,
      aud: CLIENT.id,
      sub: subjectFor("marta.quell@example.test"),
      email: "marta.quell@example.test",
      email_verified: true,
      name: "Marta Quell",
    });

    const info = await fetch(idp.endpoints.userinfo, { headers: { authorization: `Bearer ${tokens.access_token}` } });
    expect(await info.json()).toEqual({
      sub: subjectFor("marta.quell@example.test"),
      email: "marta.quell@example.test",
      email_verified: true,
      name: "Marta Quell",
    });
    // RFC 6749 §4.1.2: a code is single-use.
    expect((await exchange(code, verifier)).status).toBe(400);
  });

  it("refuses a wrong code_verifier (RFC 7636 §4.6)", async () => {
    const { challenge } = pkce();
    const code = (await signInAs(challenge, "ines.halvard@example.test")).searchParams.get("code")!;
    const res = await exchange(code, pkce().verifier);
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ error: "invalid_grant" });
  });

  it("refuses a wrong client secret with invalid_client (RFC 6749 §5.2)", async () => {
    const { verifier, challenge } = pkce();
    const code = (await signInAs(challenge, "ines.halvard@example.test")).searchParams.get("code")!;
    const res = await exchange(code, verifier, `Basic ${Buffer.from(`${CLIENT.id}:wrong-secret`).toString("base64")}`);
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: "invalid_client" });
  });

  it("does not send anyone to an unregistered redirect_uri or unknown client (RFC 6749 §4.1.2.1)", async () => {
    const { challenge } = pkce();
    const wrongRedirect = await fetch(authorizeUrl(challenge, { redirect_uri: "http://127.0.0.1:6666/steal" }), { redirect: "manual" });
    expect(wrongRedirect.status).toBe(400);
    expect(wrongRedirect.headers.get("location")).toBeNull();
    const wrongClient = await fetch(authorizeUrl(challenge, { client_id: "someone-else" }), { redirect: "manual" });
    expect(wrongClient.status).toBe(400);
  });

  it("sends the person back with an error when PKCE is missing or sign-in is cancelled", async () => {
    const noPkce = authorizeUrl("x");
    noPkce.searchParams.delete("code_challenge");
    const res = await fetch(noPkce, { redirect: "manual" });
    expect(new URL(res.headers.get("location")!).searchParams.get("error")).toBe("invalid_request");

    const form = new URLSearchParams(Object.fromEntries(authorizeUrl(pkce().challenge).searchParams));
    form.set("action", "deny");
    const cancelled = await fetch(idp.endpoints.authorization, { method: "POST", body: form, redirect: "manual" });
    const back = new URL(cancelled.headers.get("location")!);
    expect(back.searchParams.get("error")).toBe("access_denied");
    expect(back.searchParams.get("state")).toBe("st-81f2");
  });

  it("asks again, without issuing a code, when the typed e-mail is not an address", async () => {
    const form = new URLSearchParams(Object.fromEntries(authorizeUrl(pkce().challenge).searchParams));
    form.set("email", "not-an-address");
    const res = await fetch(idp.endpoints.authorization, { method: "POST", body: form, redirect: "manual" });
    expect(res.status).toBe(422);
    expect(await res.text()).toContain("Enter a valid e-mail address");
  });
});
