import nodemailer, { type Transporter } from "nodemailer";
import type SMTPTransport from "nodemailer/lib/smtp-transport";
import { env, type Env } from "~/env.server";

// Outgoing mail over SMTP: the local catcher when SMTP_URL is absent, a real relay otherwise.

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  replyTo?: string;
  /** Extra headers (List-Unsubscribe on notices a reader asked for). */
  headers?: Record<string, string>;
}

type Mailer = Transporter<SMTPTransport.SentMessageInfo>;

export function createMailTransport(mail: Env["mail"] = env().mail): Mailer {
  return nodemailer.createTransport({
    url: mail.smtpUrl,
    // A relay that never answers must not hold a request open for minutes.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
}

let transport: Mailer | undefined;
function transporter(): Mailer {
  transport ??= createMailTransport();
  return transport;
}

export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  const info = await transporter().sendMail({
    from: env().mail.from,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    replyTo: mail.replyTo,
    headers: mail.headers,
  });
  return { messageId: info.messageId };
}

export async function ping(): Promise<void> {
  await transporter().verify();
}
