import { env } from "~/env.server";
import { escapeHtml } from "~/auth/emails.server";
import { sendMail } from "~/services/mail.server";

// The keeping-track notices (watch notices, spec alerts and their digest): one layout, links built
// from APP_URL, and on every one an unsubscribe link in the body and in List-Unsubscribe, with the
// one-click POST of RFC 8058 (the link's page takes it without signing in).

export interface NoticeUnit {
  title: string;
  href: string;
  /** One line: price, place, what changed. */
  detail: string;
}

export interface Notice {
  to: string;
  subject: string;
  greeting: string;
  paragraphs: string[];
  /** Grouped units (a digest has one group per alert). */
  groups: { heading?: string; units: NoticeUnit[] }[];
  links: { label: string; href: string }[];
  /** Every notice has one; a transactional mail about the reader's own order (app/orders) has none. */
  unsubscribe?: { href: string; what: string };
}

export function appLink(path: string): string {
  return new URL(path, env().appUrl).href;
}

const muted = "font-size:13px;color:#6b5f52";

function html(n: Notice): string {
  const p = (s: string) => `<p style="margin:0 0 14px">${escapeHtml(s)}</p>`;
  const groups = n.groups
    .map(
      (g) =>
        (g.heading ? `<h2 style="font-size:16px;margin:18px 0 8px">${escapeHtml(g.heading)}</h2>` : "") +
        `<ul style="margin:0 0 14px;padding-left:18px">${g.units
          .map(
            (u) =>
              `<li style="margin:0 0 8px"><a href="${escapeHtml(u.href)}" style="color:#6a4127;font-weight:600">${escapeHtml(u.title)}</a><br><span style="${muted}">${escapeHtml(u.detail)}</span></li>`,
          )
          .join("")}</ul>`,
    )
    .join("");
  const links = n.links.map((l) => `<a href="${escapeHtml(l.href)}" style="color:#6a4127">${escapeHtml(l.label)}</a>`).join(" · ");
  return `<!doctype html><html><body style="background:#f5f0e6;color:#1f1a15;font-family:system-ui,sans-serif;font-size:15px;line-height:1.5;padding:24px">
<div style="max-width:560px;margin:0 auto;background:#fcfaf5;border:1px solid #dcd1bd;border-radius:8px;padding:24px">
${p(n.greeting)}${n.paragraphs.map(p).join("")}${groups}<p style="margin:14px 0">${links}</p>
${n.unsubscribe ? `<p style="margin:20px 0 0;${muted}">${escapeHtml(n.unsubscribe.what)} <a href="${escapeHtml(n.unsubscribe.href)}" style="color:#6b5f52">Unsubscribe</a></p>` : ""}
</div></body></html>`;
}

function text(n: Notice): string {
  const groups = n.groups.map((g) =>
    [...(g.heading ? [g.heading] : []), ...g.units.map((u) => `- ${u.title}\n  ${u.detail}\n  ${u.href}`)].join("\n"),
  );
  const links = n.links.map((l) => `${l.label}: ${l.href}`);
  const footer = n.unsubscribe ? ["--", `${n.unsubscribe.what} Unsubscribe: ${n.unsubscribe.href}`] : [];
  return [n.greeting, ...n.paragraphs, ...groups, links.join("\n"), ...footer].join("\n\n");
}

export async function sendNotice(n: Notice): Promise<void> {
  await sendMail({
    to: n.to,
    subject: n.subject,
    text: text(n),
    html: html(n),
    headers: n.unsubscribe ? { "List-Unsubscribe": `<${n.unsubscribe.href}>`, "List-Unsubscribe-Post": "List-Unsubscribe=One-Click" } : {},
  });
}
