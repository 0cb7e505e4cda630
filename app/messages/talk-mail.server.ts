import { env } from "~/env.server";
import { escapeHtml } from "~/auth/emails.server";
import { sendMail } from "~/services/mail.server";

// The mails of a conversation (new messages, each step of an offer): one plain layout, quoted
// messages as stored (masked when they were), and a link back to the thread. They are about the
// reader's own dealings, so they carry no unsubscribe link.

export interface TalkMail {
  to: string;
  subject: string;
  greeting: string;
  paragraphs: string[];
  quotes?: { who: string; text: string }[];
  link: { label: string; path: string };
}

export function appLink(path: string): string {
  return new URL(path, env().appUrl).href;
}

const muted = "font-size:13px;color:#6b5f52";

function html(m: TalkMail, href: string): string {
  const p = (s: string) => `<p style="margin:0 0 14px">${escapeHtml(s)}</p>`;
  const quotes = (m.quotes ?? [])
    .map(
      (q) =>
        `<blockquote style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #b08a63;background:#f5f0e6"><span style="${muted}">${escapeHtml(q.who)}</span><br>${escapeHtml(q.text).replace(/\n/g, "<br>")}</blockquote>`,
    )
    .join("");
  return `<!doctype html><html><body style="background:#f5f0e6;color:#1f1a15;font-family:system-ui,sans-serif;font-size:15px;line-height:1.5;padding:24px">
<div style="max-width:560px;margin:0 auto;background:#fcfaf5;border:1px solid #dcd1bd;border-radius:8px;padding:24px">
${p(m.greeting)}${m.paragraphs.map(p).join("")}${quotes}<p style="margin:14px 0"><a href="${escapeHtml(href)}" style="color:#6a4127;font-weight:600">${escapeHtml(m.link.label)}</a></p>
<p style="margin:20px 0 0;${muted}">Keep the conversation and the payment on Loadline: the money is held until the unit has passed your audition.</p>
</div></body></html>`;
}

function text(m: TalkMail, href: string): string {
  const quotes = (m.quotes ?? []).map((q) => `${q.who}:\n${q.text.replace(/^/gm, "> ")}`);
  return [m.greeting, ...m.paragraphs, ...quotes, `${m.link.label}: ${href}`].join("\n\n");
}

export async function sendTalkMail(m: TalkMail): Promise<void> {
  const href = appLink(m.link.path);
  await sendMail({ to: m.to, subject: m.subject, text: text(m, href), html: html(m, href) });
}
