import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { testClock } from "../support/clock";
import { account, cleanUp, liveUnit, runQueue, type SentMail } from "./talk-support";
import { signedInCookie } from "../support/sessions";
import { routeArgs } from "../support/route-args";
import { call } from "./listing-support";

// Threads: one per listing and buyer, only its two sides may read or write it (anyone else: 404, as
// for a thread that does not exist), unread first in the list, and the header's count follows.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { openThread, threadList, conversation, sendMessage } = await import("~/messages/threads.server");
const { unreadCount } = await import("~/messages/unread.server");
const { deliverMessageMail } = await import("~/messages/message-mail.server");
const { QUEUES } = await import("~/services/jobs.server");
const threadApi = await import("~/routes/api.v1.threads.$id.messages");
const threadsApi = await import("~/routes/api.v1.threads");
const threadPage = await import("~/routes/messages/thread");
const messagesPage = await import("~/routes/messages/index");

const BASE = "http://127.0.0.1";
let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;
let bo: Awaited<ReturnType<typeof account>>;
let stranger: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("th-seller", ["buyer", "seller"]);
  ada = await account("th-ada");
  bo = await account("th-bo");
  stranger = await account("th-stranger", ["buyer", "moderator"]);
});
afterAll(async () => {
  await runQueue(QUEUES.messageMail, deliverMessageMail);
  await cleanUp();
  await sequelize.close();
});

const t = (minutes: number) => new Date(Date.UTC(2026, 11, 30, 10, minutes));

describe("one thread per listing and buyer", () => {
  it("opens the same thread again for the same buyer, another for another buyer", async () => {
    const unit = await liveUnit(seller.id);
    const first = await openThread(ada.id, unit.id);
    expect((await openThread(ada.id, unit.id)).id).toBe(first.id);
    const other = await openThread(bo.id, unit.id);
    expect(other.id).not.toBe(first.id);
    expect(first.sellerId).toBe(seller.id);
    expect(other.sellerId).toBe(seller.id);
  });

  it("refuses the seller's own unit (409) and a unit not for sale (404)", async () => {
    const unit = await liveUnit(seller.id);
    await expect(openThread(seller.id, unit.id)).rejects.toMatchObject({ status: 409 });
    const draft = await liveUnit(seller.id, { status: "draft", publishedAt: null });
    await expect(openThread(ada.id, draft.id)).rejects.toMatchObject({ status: 404 });
    await expect(openThread(ada.id, "not-an-id")).rejects.toMatchObject({ status: 404 });
  });
});

describe("only the two sides", () => {
  it("gives anyone else (a moderator included) the same 404 as a missing thread, in services, API and page", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    await sendMessage(ada.id, thread.id, "Is the hum gone after the recap?", testClock(t(0)));
    await expect(conversation(stranger.id, thread.id)).rejects.toMatchObject({ status: 404 });
    await expect(sendMessage(stranger.id, thread.id, "hello")).rejects.toMatchObject({ status: 404 });

    const cookie = await signedInCookie(stranger);
    const get = (path: string) =>
      routeArgs(new Request(BASE + path, { headers: { Cookie: cookie } }), { id: thread.id, threadId: thread.id });
    const api = await call(() => threadApi.loader(get(`/api/v1/threads/${thread.id}/messages`)));
    expect(api.status).toBe(404);
    expect(api.body.error).toBe("not_found");
    const page = await call(() => threadPage.loader(get(`/messages/${thread.id}`)));
    expect(page.status).toBe(404);
    const post = await call(() =>
      threadApi.action(
        routeArgs(
          new Request(`${BASE}/api/v1/threads/${thread.id}/messages`, {
            method: "POST",
            headers: { Cookie: cookie, "Content-Type": "application/json" },
            body: JSON.stringify({ body: "let me in" }),
          }),
          { id: thread.id },
        ),
      ),
    );
    expect(post.status).toBe(404);
    // The seller and the buyer both read it.
    expect((await conversation(seller.id, thread.id)).items).toHaveLength(1);
    expect((await conversation(ada.id, thread.id)).thread.role).toBe("buyer");
  });
});

describe("reading and writing", () => {
  it("shows each side its own messages as its own, lists unread threads first and keeps the count", async () => {
    const [u1, u2] = [await liveUnit(seller.id), await liveUnit(seller.id)];
    const older = await openThread(ada.id, u1.id);
    const newer = await openThread(bo.id, u2.id);
    await sendMessage(ada.id, older.id, "Does it come with the original box?", testClock(t(1)));
    await sendMessage(bo.id, newer.id, "Would you post it to the coast?", testClock(t(2)));
    const before = await unreadCount(seller.id);
    expect(before).toBeGreaterThanOrEqual(2);

    // The seller reads the newer one: the older (still unread) comes first in the list.
    await conversation(seller.id, newer.id, testClock(t(3)));
    const list = (await threadList(seller.id)).filter((s) => s.id === older.id || s.id === newer.id);
    expect(list.map((s) => [s.id, s.unread])).toEqual([
      [older.id, true],
      [newer.id, false],
    ]);
    expect(await unreadCount(seller.id)).toBe(before - 1);

    // The seller answers: Ada has one unread, the seller's own answer does not count for the seller.
    await sendMessage(seller.id, older.id, "Yes, with its foam inserts.", testClock(t(4)));
    expect(await unreadCount(seller.id)).toBe(before - 2);
    expect(await unreadCount(ada.id)).toBeGreaterThanOrEqual(1);
    const seen = await conversation(ada.id, older.id, testClock(t(5)));
    expect(seen.items.map((i) => (i.kind === "message" ? [i.fromMe, i.body] : null))).toEqual([
      [true, "Does it come with the original box?"],
      [false, "Yes, with its foam inserts."],
    ]);
    expect((await threadList(ada.id)).find((s) => s.id === older.id)?.unread).toBe(false);
  });

  it("takes a message through the API and refuses an empty one next to its field", async () => {
    const unit = await liveUnit(seller.id);
    const cookie = await signedInCookie(ada);
    const open = await call(() =>
      threadsApi.action(
        routeArgs(
          new Request(`${BASE}/api/v1/threads`, {
            method: "POST",
            headers: { Cookie: cookie, "Content-Type": "application/json" },
            body: JSON.stringify({ listingId: unit.id }),
          }),
          {},
        ),
      ),
    );
    expect(open.status).toBe(201);
    const id: string = open.body.thread.id;
    const send = (body: string) =>
      call(() =>
        threadApi.action(
          routeArgs(
            new Request(`${BASE}/api/v1/threads/${id}/messages`, {
              method: "POST",
              headers: { Cookie: cookie, "Content-Type": "application/json" },
              body: JSON.stringify({ body }),
            }),
            { id },
          ),
        ),
      );
    const empty = await send("   ");
    expect(empty.status).toBe(400);
    expect(empty.body.issues[0].path).toBe("body");
    const ok = await send("Which valves are fitted now?");
    expect(ok.status).toBe(201);
    expect(ok.body.message).toMatchObject({ body: "Which valves are fitted now?", masked: false });
  });

  it("sends the page's plain form back to the thread, and an empty message back with its error", async () => {
    const unit = await liveUnit(seller.id);
    const cookie = await signedInCookie(bo);
    const form = <P extends Record<string, string>>(path: string, fields: Record<string, string>, params: P) =>
      routeArgs(
        new Request(BASE + path, {
          method: "POST",
          body: new URLSearchParams(fields),
          headers: { Cookie: cookie, "Content-Type": "application/x-www-form-urlencoded" },
        }),
        params,
      );
    const opened = await messagesPage.action(form("/messages", { intent: "offer", listingId: unit.id }, {}));
    expect(opened).toBeInstanceOf(Response);
    const location = opened.headers.get("Location") ?? "";
    expect(location).toMatch(/^\/messages\/[0-9a-f-]{36}#make-offer$/);
    const threadId = location.slice("/messages/".length, -"#make-offer".length);
    const bad = await call(() => threadPage.action(form(`/messages/${threadId}`, { intent: "send", body: "" }, { threadId })));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.body).toBe("Write a message first.");
    const good = await threadPage.action(form(`/messages/${threadId}`, { intent: "send", body: "Still for sale?" }, { threadId }));
    expect(good instanceof Response && good.headers.get("Location")).toBe(`/messages/${threadId}`);
  });
});
