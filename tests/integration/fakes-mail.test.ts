import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startMailCatcher, type RunningMailCatcher } from "../../fakes/mail-catcher";
import type { CaughtMessage } from "../../fakes/mail-store";

// Mail sent by the app (app/services/mail.server.ts, nodemailer over SMTP) lands in the local catcher,
// readable over its JSON API and in its HTML inbox.
describe("mail catcher", () => {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-mail-"));
  const file = path.join(dir, "messages.json");
  let catcher: RunningMailCatcher;
  let mail: typeof import("~/services/mail.server");

  const api = async <T>(p: string, init?: RequestInit): Promise<T> => (await fetch(catcher.inboxUrl + p, init)).json() as Promise<T>;

  beforeAll(async () => {
    catcher = await startMailCatcher({ smtpPort: 0, httpPort: 0, file });
    vi.stubEnv("SMTP_URL", undefined);
    vi.stubEnv("FAKE_SMTP_PORT", new URL(catcher.smtpUrl).port);
    vi.resetModules();
    mail = await import("~/services/mail.server");
  });
  afterAll(async () => {
    await catcher?.stop();
    vi.unstubAllEnvs();
    rmSync(dir, { recursive: true, force: true });
  });

  const link = "http://127.0.0.1:3000/verify-email/tok_9f2c?next=%2Fsell&x=1";

  it("delivers a verification mail whose link arrives intact in text and HTML", async () => {
    await mail.ping();
    await mail.sendMail({
      to: "Ines Halvard <ines.halvard@example.test>",
      subject: "Confirm your e-mail address",
      text: `Open this link to confirm your address:\n${link}\n`,
      html: `<p>Open <a href="${link.replace(/&/g, "&amp;")}">this link</a> to confirm your address.</p>`,
    });
    const list = await api<CaughtMessage[]>("/api/messages?to=ines.halvard@example.test");
    expect(list).toHaveLength(1);
    const [m] = list;
    expect(m.subject).toBe("Confirm your e-mail address");
    expect(m.to).toEqual(["ines.halvard@example.test"]);
    expect(m.from).toContain("no-reply@loadline.test");
    expect(m.text).toContain(link);
    expect(m.links).toEqual([link]);
    expect(await api<CaughtMessage>(`/api/messages/${m.id}`)).toMatchObject({ id: m.id, html: expect.stringContaining("this link") });
  });

  it("filters by recipient and lists the newest first", async () => {
    await mail.sendMail({ to: "oskar.brandt@example.test", subject: "Spec alert: 3 new amplifiers", text: "first" });
    await mail.sendMail({ to: "oskar.brandt@example.test", subject: "Spec alert: 1 new turntable", text: "second" });
    const list = await api<CaughtMessage[]>("/api/messages?to=OSKAR.BRANDT@example.test");
    expect(list.map((m) => m.text.trim())).toEqual(["second", "first"]);
    expect((await api<CaughtMessage[]>("/api/messages")).length).toBe(3);
    expect((await fetch(`${catcher.inboxUrl}/api/messages/nope`)).status).toBe(404);
  });

  it("shows the inbox in a browser with the mail's link clickable", async () => {
    const inbox = await (await fetch(`${catcher.inboxUrl}/`)).text();
    expect(inbox).toContain("Spec alert: 1 new turntable");
    const [m] = await api<CaughtMessage[]>("/api/messages?to=ines.halvard@example.test");
    const page = await (await fetch(`${catcher.inboxUrl}/messages/${m.id}`)).text();
    expect(page).toContain(`<a href="${link.replace(/&/g, "&amp;")}">`);
    const body = await fetch(`${catcher.inboxUrl}/messages/${m.id}/body.html`);
    expect(body.headers.get("content-security-policy")).toContain("default-src 'none'");
    expect(await body.text()).toContain('<base target="_top">');
  });

  it("keeps the inbox across a restart, and empties it on DELETE", async () => {
    await catcher.stop();
    catcher = await startMailCatcher({ smtpPort: Number(new URL(catcher.smtpUrl).port), httpPort: 0, file });
    expect((await api<CaughtMessage[]>("/api/messages")).length).toBe(3);
    expect((await fetch(`${catcher.inboxUrl}/api/messages`, { method: "DELETE" })).status).toBe(204);
    expect(await api<CaughtMessage[]>("/api/messages")).toEqual([]);
  });
});
