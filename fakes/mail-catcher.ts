import { simpleParser, type AddressObject } from "mailparser";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import { SMTPServer } from "smtp-server";
import { close, listen, readForm, redirect, sendHtml, sendJson } from "./http";
import { MailStore, extractLinks, type CaughtMessage } from "./mail-store";
import { inboxPage, messageBody, messagePage, notFoundPage } from "./mail-pages";

// Local mail catcher: takes every message over SMTP (no TLS, any or no credentials) and shows it
// over HTTP, as a JSON API for tests and an HTML inbox for developers.

export interface MailCatcherOptions {
  smtpPort: number;
  httpPort: number;
  host?: string;
  /** JSON file that keeps the inbox across restarts; in memory only when absent. */
  file?: string;
}

export interface RunningMailCatcher {
  smtpUrl: string;
  inboxUrl: string;
  store: MailStore;
  stop: () => Promise<void>;
}

const MAX_SIZE = 25 * 1024 * 1024;

export async function startMailCatcher(opts: MailCatcherOptions): Promise<RunningMailCatcher> {
  const host = opts.host ?? "127.0.0.1";
  const store = new MailStore(opts.file);

  const smtp = new SMTPServer({
    banner: "Loadline mail catcher",
    authOptional: true,
    allowInsecureAuth: true,
    disabledCommands: ["STARTTLS"],
    disableReverseLookup: true, // a DNS lookup per connection only slows local sends
    size: MAX_SIZE,
    logger: false,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? "local" });
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          if ((stream as { sizeExceeded?: boolean }).sizeExceeded) {
            callback(Object.assign(new Error("Message exceeds the size limit"), { responseCode: 552 }));
            return;
          }
          const text = parsed.text ?? "";
          const htmlPart = typeof parsed.html === "string" ? parsed.html : null;
          const headers: Record<string, string> = {};
          for (const line of parsed.headerLines) headers[line.key] = line.line.slice(line.key.length + 1).trim();
          const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
          store.add({
            envelope: { from: envelopeFrom, to: session.envelope.rcptTo.map((r) => r.address) },
            from: parsed.from?.text ?? envelopeFrom,
            to: addresses(parsed.to),
            cc: addresses(parsed.cc),
            subject: parsed.subject ?? "",
            messageId: parsed.messageId ?? null,
            date: parsed.date?.toISOString() ?? null,
            text,
            html: htmlPart,
            headers,
            links: extractLinks(text, htmlPart),
            size: (stream as { byteLength?: number }).byteLength ?? 0,
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  smtp.on("error", () => {
    // A client dropping mid-session is routine; the server keeps listening.
  });

  const http = createServer((req, res) => {
    handle(store, req, res).catch((err) => sendJson(res, 500, { error: String(err?.message ?? err) }));
  });

  await new Promise<void>((resolve, reject) => {
    smtp.server.once("error", reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });
  let httpPort: number;
  try {
    httpPort = await listen(http, opts.httpPort, host);
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }
  const smtpPort = (smtp.server.address() as { port: number }).port;

  return {
    smtpUrl: `smtp://${host}:${smtpPort}`,
    inboxUrl: `http://${host}:${httpPort}`,
    store,
    async stop() {
      await Promise.all([close(http), new Promise<void>((resolve) => smtp.close(() => resolve()))]);
    },
  };
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  if (!field) return [];
  const list = Array.isArray(field) ? field : [field];
  return list.flatMap((a) => a.value.map((v) => v.address ?? "").filter(Boolean));
}

async function handle(store: MailStore, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? "/", "http://catcher.local");
  const parts = url.pathname.split("/").filter(Boolean);
  const method = req.method ?? "GET";

  if (parts[0] === "api" && parts[1] === "messages") {
    if (parts.length === 2 && method === "GET") {
      return sendJson(res, 200, store.list({ to: url.searchParams.get("to") ?? undefined }));
    }
    if (parts.length === 2 && method === "DELETE") {
      store.clear();
      res.writeHead(204).end();
      return;
    }
    const message = parts.length === 3 ? store.get(parts[2]) : undefined;
    if (parts.length === 3 && method === "GET") {
      return message ? sendJson(res, 200, message) : sendJson(res, 404, { error: "no message with that id" });
    }
    if (parts.length === 3 && method === "DELETE") {
      if (!store.remove(parts[2])) return sendJson(res, 404, { error: "no message with that id" });
      res.writeHead(204).end();
      return;
    }
    return sendJson(res, 405, { error: `${method} is not supported here` });
  }

  if (method === "GET" && parts.length === 0) {
    const to = url.searchParams.get("to") ?? "";
    return sendHtml(res, 200, inboxPage(store.list({ to }), to));
  }
  if (method === "POST" && parts[0] === "clear" && parts.length === 1) {
    await readForm(req);
    store.clear();
    return redirect(res, "/");
  }
  if (method === "GET" && parts[0] === "messages" && parts.length >= 2) {
    const message: CaughtMessage | undefined = store.get(parts[1]);
    if (!message) return sendHtml(res, 404, notFoundPage());
    if (parts[2] === "body.html") {
      // Shown inside a sandboxed iframe: no scripts, links open in the top window.
      return sendHtml(res, 200, messageBody(message), {
        "content-security-policy": "default-src 'none'; img-src * data:; style-src 'unsafe-inline'; font-src *",
      });
    }
    if (parts.length === 2) return sendHtml(res, 200, messagePage(message));
  }
  return sendHtml(res, 404, notFoundPage());
}
