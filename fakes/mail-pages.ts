import { escapeHtml, html, page, raw } from "./html";
import type { CaughtMessage } from "./mail-store";

// The developer's inbox: a list of caught messages and a reading view with clickable links.

const SERVICE = "mail catcher";

function when(iso: string): string {
  return iso.replace("T", " ").slice(0, 19) + " UTC";
}

export function inboxPage(messages: CaughtMessage[], to: string): string {
  const rows = messages.map(
    (m) =>
      html`<tr>
        <td class="mono muted">${when(m.receivedAt)}</td>
        <td>${m.to.join(", ") || m.envelope.to.join(", ")}</td>
        <td><a href="/messages/${m.id}">${m.subject || "(no subject)"}</a></td>
      </tr>`,
  );
  const body = html` <h1>Inbox</h1>
    <p class="lede">Every e-mail Loadline sends while running locally lands here. Newest first.</p>
    <form method="get" action="/" class="row" style="align-items:flex-end">
      <div><label for="to">Recipient</label><input id="to" name="to" type="email" value="${to}" placeholder="any recipient" /></div>
      <div style="flex:0"><button type="submit" class="quiet">Filter</button></div>
      <div style="flex:0"><a class="button quiet" href="/">Refresh</a></div>
    </form>
    <h2>${messages.length} message${messages.length === 1 ? "" : "s"}${to ? html` to ${to}` : ""}</h2>
    ${
      messages.length
        ? html`<table>
              <thead>
                <tr>
                  <th>Received</th>
                  <th>To</th>
                  <th>Subject</th>
                </tr>
              </thead>
              <tbody>
                ${rows}
              </tbody>
            </table>
            <form method="post" action="/clear"><button type="submit" class="quiet">Delete all messages</button></form>`
        : html`<div class="card muted">No messages yet. Sign up, reset a password or save a spec alert in the app, then refresh.</div>`
    }`;
  return page({ title: "Inbox · Loadline mail catcher", service: SERVICE, body });
}

/** Text part with its URLs turned into links (everything else escaped). */
function linkify(text: string): string {
  const LINK = /https?:\/\/[^\s<>"']+[^\s<>"'().,;:!?]/g;
  let out = "";
  let last = 0;
  for (const m of text.matchAll(LINK)) {
    out += escapeHtml(text.slice(last, m.index));
    out += `<a href="${escapeHtml(m[0])}">${escapeHtml(m[0])}</a>`;
    last = (m.index ?? 0) + m[0].length;
  }
  return out + escapeHtml(text.slice(last));
}

export function messagePage(m: CaughtMessage): string {
  const body = html` <p><a href="/">← Inbox</a></p>
    <h1>${m.subject || "(no subject)"}</h1>
    <div class="card">
      <dl>
        <dt>From</dt>
        <dd>${m.from}</dd>
        <dt>To</dt>
        <dd>${m.to.join(", ")}</dd>
        ${
          m.cc.length
            ? html`<dt>Cc</dt>
                <dd>${m.cc.join(", ")}</dd>`
            : ""
        }
        <dt>Envelope</dt>
        <dd class="mono">${m.envelope.from} → ${m.envelope.to.join(", ")}</dd>
        <dt>Received</dt>
        <dd class="mono">${when(m.receivedAt)}</dd>
      </dl>
    </div>
    ${
      m.html
        ? html`<h2>HTML part</h2>
            <iframe
              title="HTML part of the message"
              src="/messages/${m.id}/body.html"
              sandbox="allow-popups allow-popups-to-escape-sandbox allow-top-navigation-by-user-activation"
            ></iframe>`
        : ""
    }
    <h2>Text part</h2>
    <pre>${m.text ? raw(linkify(m.text)) : "(empty)"}</pre>
    ${
      m.links.length
        ? html`<h2>Links</h2>
            <ul>
              ${m.links.map((l) => html`<li><a href="${l}">${l}</a></li>`)}
            </ul>`
        : ""
    }`;
  return page({ title: `${m.subject} · Loadline mail catcher`, service: SERVICE, body });
}

export function messageBody(m: CaughtMessage): string {
  const base = '<base target="_top">';
  const doc = m.html ?? "";
  return /<head[^>]*>/i.test(doc) ? doc.replace(/<head[^>]*>/i, (h) => h + base) : base + doc;
}

export function notFoundPage(): string {
  const body = html`<h1>Not here</h1>
    <p class="lede">That message is gone or never arrived.</p>
    <p><a href="/">← Inbox</a></p>`;
  return page({ title: "Not found · Loadline mail catcher", service: SERVICE, body });
}
