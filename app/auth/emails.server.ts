import { env } from "~/env.server";
import { sendMail } from "~/services/mail.server";

// The account e-mails. Links are built from APP_URL, never from the request's Host header, so a
// forged Host cannot make us mail out links to someone else's site.

function link(path: string): string {
  return new URL(path, env().appUrl).href;
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function html(greeting: string, paragraphs: string[], action: { label: string; href: string } | null, footer: string) {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join("");
  const button = action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(action.href)}" style="background:#6a4127;color:#fcfaf5;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>
       <p style="margin:0 0 14px;font-size:13px;color:#6b5f52">Or paste this address into your browser:<br><span style="word-break:break-all">${escapeHtml(action.href)}</span></p>`
    : "";
  return `<!doctype html><html><body style="background:#f5f0e6;color:#1f1a15;font-family:system-ui,sans-serif;font-size:15px;line-height:1.5;padding:24px">
<div style="max-width:520px;margin:0 auto;background:#fcfaf5;border:1px solid #dcd1bd;border-radius:8px;padding:24px">
<p style="margin:0 0 14px">${escapeHtml(greeting)}</p>${body}${button}
<p style="margin:20px 0 0;font-size:13px;color:#6b5f52">${escapeHtml(footer)}</p>
</div></body></html>`;
}

function text(greeting: string, paragraphs: string[], action: { label: string; href: string } | null, footer: string) {
  return [greeting, ...paragraphs, ...(action ? [`${action.label}: ${action.href}`] : []), "--", footer].join("\n\n");
}

/** The mail relay refused or could not be reached; pages say so instead of failing whole. */
export class MailDeliveryError extends Error {
  override name = "MailDeliveryError";
}

export const MAIL_UNAVAILABLE = "We could not send e-mail just now, so nothing was changed. Please try again in a few minutes.";

async function send(to: string, subject: string, greeting: string, paragraphs: string[], action: { label: string; href: string } | null) {
  const footer = "Loadline: the market where hi-fi is sold with its bench measurements checked.";
  try {
    await sendMail({
      to,
      subject,
      text: text(greeting, paragraphs, action, footer),
      html: html(greeting, paragraphs, action, footer),
    });
  } catch (error) {
    console.error(`Mail to ${to} ("${subject}") failed:`, error);
    throw new MailDeliveryError("mail relay unavailable", { cause: error });
  }
}

export function verificationUrl(token: string) {
  return link(`/verify-email/${token}`);
}

export function resetUrl(token: string) {
  return link(`/reset-password/${token}`);
}

export async function sendVerificationEmail(to: { email: string; displayName: string }, token: string) {
  await send(
    to.email,
    "Confirm your e-mail address for Loadline",
    `Hello ${to.displayName},`,
    [
      "Please confirm that this address is yours. Confirming also signs you in.",
      "The link works once and for 24 hours. If you did not create a Loadline account, ignore this e-mail and nothing happens.",
    ],
    { label: "Confirm my e-mail address", href: verificationUrl(token) },
  );
}

export async function sendPasswordResetEmail(to: { email: string; displayName: string }, token: string) {
  await send(
    to.email,
    "Choose a new Loadline password",
    `Hello ${to.displayName},`,
    [
      "Someone asked to reset the password of the Loadline account that uses this address. If it was you, choose a new password with the link below.",
      "The link works once and for 1 hour. If it was not you, ignore this e-mail: your password stays as it is.",
    ],
    { label: "Choose a new password", href: resetUrl(token) },
  );
}

/** Sent instead of a second account, so the sign-up form never tells a stranger which addresses are taken. */
export async function sendAccountExistsEmail(to: { email: string; displayName: string }) {
  await send(
    to.email,
    "You already have a Loadline account",
    `Hello ${to.displayName},`,
    [
      "Someone tried to create a new Loadline account with this address, which already has one.",
      "If it was you, sign in instead; if you have forgotten the password, the sign-in page can send you a reset link. If it was not you, ignore this e-mail.",
    ],
    { label: "Sign in to Loadline", href: link("/sign-in") },
  );
}

/** Repeated wrong passwords for an account: its owner hears once an hour at most (rate-limit.server.ts). */
export async function sendSignInWarningEmail(to: { email: string; displayName: string }, seen: { failures: number; addresses: number }) {
  const from = seen.addresses === 1 ? "one address" : `${seen.addresses} addresses`;
  await send(
    to.email,
    "Failed sign-ins to your Loadline account",
    `Hello ${to.displayName},`,
    [
      `In the last hour someone typed a wrong password for your Loadline account ${seen.failures} times, from ${from}.`,
      "If it was you, nothing needs doing. If not, your password kept them out, and you can still sign in from your usual devices; they are being slowed down. If your password is short or used elsewhere, choose a new one.",
    ],
    { label: "Choose a new password", href: link("/forgot-password") },
  );
}
