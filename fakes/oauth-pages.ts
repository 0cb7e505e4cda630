import { html, page } from "./html";

// The local identity provider's own screens: pick who to sign in as, or explain a bad request.

const SERVICE = "Loadline pass (identity provider)";

export interface SignInPageInput {
  params: Record<string, string>;
  suggestions: { email: string; name: string }[];
  email?: string;
  name?: string;
  error?: string;
}

export function signInPage(input: SignInPageInput): string {
  const hidden = Object.entries(input.params).map(([k, v]) => html`<input type="hidden" name="${k}" value="${v}" />`);
  const body = html` <h1>Sign in with your Loadline pass</h1>
    <p class="lede">
      The Loadline pass stand-in. Choose the e-mail address to sign in as; the app receives it as a verified address, as it would from a
      real provider.
    </p>
    <form class="card" method="post" action="/authorize">
      ${hidden}
      <label for="email">E-mail address</label>
      <input
        id="email"
        name="email"
        type="email"
        autocomplete="email"
        required
        autofocus
        value="${input.email ?? ""}"
        ${input.error ? html`aria-invalid="true" aria-describedby="email-error"` : ""}
      />
      ${input.error ? html`<p id="email-error" class="error" role="alert">${input.error}</p>` : ""}
      <label for="name">Display name <span class="muted">(optional)</span></label>
      <input id="name" name="name" type="text" autocomplete="name" value="${input.name ?? ""}" />
      <div class="row" style="align-items:center">
        <div><button type="submit" name="action" value="allow">Continue</button></div>
        <div style="text-align:right"><button type="submit" name="action" value="deny" class="quiet" formnovalidate>Cancel</button></div>
      </div>
      ${
        input.suggestions.length
          ? html`<h2>Demo accounts</h2>
              <p class="muted">Sign in as one of them with one click.</p>
              <div class="chips">
                ${input.suggestions.map(
                  (s) => html`<button type="submit" name="pick" value="${s.email}" formnovalidate title="${s.email}">${s.name}</button>`,
                )}
              </div>`
          : ""
      }
    </form>`;
  return page({ title: "Sign in · Loadline pass stand-in", service: SERVICE, body, narrow: true });
}

export function badRequestPage(reason: string): string {
  const body = html` <h1>This sign-in request is not valid</h1>
    <p class="error">${reason}</p>
    <p class="lede">The app that sent you here is misconfigured, so you are not sent back to it.</p>`;
  return page({ title: "Bad request · Loadline pass stand-in", service: SERVICE, body, narrow: true });
}
