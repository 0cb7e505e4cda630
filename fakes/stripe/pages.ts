import { html, page, type Raw } from "../html";
import type { CardForm } from "./checkout";
import type { DeliveryAttempt } from "./webhooks";
import type { StripeObject } from "./store";

// The payments stand-in's own pages: hosted payment, connected-account onboarding and an index of
// recent events with their webhook deliveries.

const SERVICE = "payments";

export function formatMoney(amount: number, currency: string): string {
  const fmt = new Intl.NumberFormat("en-GB", { style: "currency", currency: currency.toUpperCase() });
  const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2;
  return fmt.format(amount / 10 ** digits);
}

const TEST_CARDS = html`<p class="muted">
  Test cards: <span class="mono">4242 4242 4242 4242</span> is approved · <span class="mono">4000 0000 0000 0002</span> is declined ·
  <span class="mono">4000 0000 0000 9995</span> has insufficient funds. Any future expiry and any three-digit security code.
</p>`;

function field(id: keyof CardForm, label: string, value: string, error: { field?: string; message?: string }, attrs: Raw): Raw {
  const bad = error.field === id;
  return html`<label for="${id}">${label}</label>
    <input id="${id}" name="${id}" value="${value}" ${attrs} ${bad ? html`aria-invalid="true" aria-describedby="${id}-error"` : ""} />
    ${bad ? html`<p id="${id}-error" class="error" role="alert">${error.message}</p>` : ""}`;
}

export function checkoutPage(
  session: StripeObject,
  form: Partial<CardForm> = {},
  error: { field?: string; message?: string } = {},
): string {
  const items: { description: string; quantity: number; amount_total: number; currency: string }[] = session._line_items;
  const closed = session.status !== "open";
  const body = html` <h1>Pay Loadline</h1>
    <p class="lede">Hosted payment page of the local payments stand-in. No real card is charged.</p>
    <div class="card">
      <table style="border:0">
        <tbody>
          ${items.map(
            (i) =>
              html`<tr>
                <td>${i.description}${i.quantity > 1 ? html` × ${i.quantity}` : ""}</td>
                <td class="mono" style="text-align:right">${formatMoney(i.amount_total, i.currency)}</td>
              </tr>`,
          )}
        </tbody>
      </table>
      <p style="margin:14px 0 0">
        Total <span class="total mono" style="float:right">${formatMoney(session.amount_total, session.currency)}</span>
      </p>
    </div>
    ${
      closed
        ? html`<div class="card" style="margin-top:16px">
            <p class="${session.status === "complete" ? "ok" : "error"}">
              ${session.status === "complete" ? "This checkout is already paid." : "This checkout has expired."}
            </p>
            ${session.status === "complete" ? html`<a class="button" href="${session.success_url.replace(/\{CHECKOUT_SESSION_ID\}/g, session.id)}">Back to Loadline</a>` : ""}
          </div>`
        : html`<form class="card" method="post" style="margin-top:16px" novalidate>
            ${error.message && !error.field ? html`<p class="error" role="alert">${error.message}</p>` : ""}
            ${field("email", "E-mail", form.email ?? session.customer_email ?? "", error, html`type="email" autocomplete="email" required`)}
            ${field("number", "Card number", form.number ?? "", error, html`inputmode="numeric" autocomplete="cc-number" placeholder="4242 4242 4242 4242" required`)}
            <div class="row">
              <div>
                ${field("exp", "Expiry (MM / YY)", form.exp ?? "", error, html`autocomplete="cc-exp" placeholder="12 / 30" required`)}
              </div>
              <div>
                ${field("cvc", "Security code", form.cvc ?? "", error, html`inputmode="numeric" autocomplete="cc-csc" placeholder="123" required`)}
              </div>
            </div>
            ${field("name", "Name on card", form.name ?? "", error, html`autocomplete="cc-name"`)}
            <button type="submit">Pay ${formatMoney(session.amount_total, session.currency)}</button>
            ${session.cancel_url ? html` <a class="button quiet" href="${session.cancel_url}">Cancel</a>` : ""} ${TEST_CARDS}
          </form>`
    }`;
  return page({ title: "Pay · Loadline payments stand-in", service: SERVICE, body, narrow: true });
}

export function onboardingPage(token: string, account: StripeObject, error?: string): string {
  const body = html` <h1>Get paid through Loadline</h1>
    <p class="lede">
      Onboarding for connected account <span class="mono">${account.id}</span> on the local payments stand-in. Finishing enables card
      payments and payouts for this account.
    </p>
    <form class="card" method="post" action="/connect/onboarding/${token}">
      ${error ? html`<p class="error" role="alert">${error}</p>` : ""}
      <label for="business_name">Business or trading name</label>
      <input id="business_name" name="business_name" value="${account.business_profile?.name ?? ""}" autocomplete="organization" />
      <label for="account_number">Payout bank account (test)</label>
      <input id="account_number" name="account_number" value="000123456789" inputmode="numeric" />
      <p class="muted">Any digits do; only the last four are kept.</p>
      <button type="submit" name="action" value="finish">Finish onboarding</button>
    </form>`;
  return page({ title: "Onboarding · Loadline payments stand-in", service: SERVICE, body, narrow: true });
}

export function messagePage(title: string, message: string, link?: { href: string; label: string }): string {
  const body = html`<h1>${title}</h1>
    <p class="lede">${message}</p>
    ${link ? html`<a class="button" href="${link.href}">${link.label}</a>` : ""}`;
  return page({ title: `${title} · Loadline payments stand-in`, service: SERVICE, body, narrow: true });
}

export function indexPage(events: StripeObject[], webhookUrl: string | null): string {
  const status = (e: StripeObject) => {
    const tries: DeliveryAttempt[] = e._deliveries ?? [];
    if (!webhookUrl) return "not sent";
    if (!tries.length) return "queued";
    const last = tries[tries.length - 1];
    const ok = last.status !== null && last.status < 300 && last.status >= 200;
    return `${ok ? "delivered" : "failing"} (${last.status ?? last.error}, ${tries.length} attempt${tries.length > 1 ? "s" : ""})`;
  };
  const body = html` <h1>Payments stand-in</h1>
    <p class="lede">
      Speaks the part of the payments API that Loadline uses. Webhooks go to <span class="mono">${webhookUrl ?? "(none configured)"}</span>.
    </p>
    <table>
      <thead>
        <tr>
          <th>When (UTC)</th>
          <th>Event</th>
          <th>Object</th>
          <th>Webhook</th>
        </tr>
      </thead>
      <tbody>
        ${events.map(
          (e) =>
            html`<tr>
              <td class="mono muted">${new Date(e.created * 1000).toISOString().slice(0, 19).replace("T", " ")}</td>
              <td class="mono">${e.type}</td>
              <td class="mono">${e.data.object.id}</td>
              <td>${status(e)}</td>
            </tr>`,
        )}
      </tbody>
    </table>`;
  return page({ title: "Loadline payments stand-in", service: SERVICE, body });
}
