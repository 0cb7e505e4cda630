import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { testClock } from "../support/clock";
import { account, cleanUp, liveUnit, recipients, runQueue, waiting, type SentMail } from "./talk-support";

// A burst of messages is one e-mail: the first queues a deferred job keyed by thread and recipient,
// the rest of the burst queue nothing, and the job sends what is unread then, once.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { openThread, conversation, sendMessage } = await import("~/messages/threads.server");
const { deliverMessageMail, MESSAGE_MAIL_DELAY_SECONDS } = await import("~/messages/message-mail.server");
const { QUEUES } = await import("~/services/jobs.server");

const run = () => runQueue(QUEUES.messageMail, deliverMessageMail);

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("mail-seller", ["buyer", "seller"]);
  ada = await account("mail-ada");
  await run(); // whatever an earlier suite left
});
beforeEach(() => {
  sent.length = 0;
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

describe("message mail", () => {
  it("queues one deferred job for a burst and sends one mail with every message in it", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    const queuedAt = Date.now();
    await sendMessage(ada.id, thread.id, "Hello, is the phono stage MM only?");
    await sendMessage(ada.id, thread.id, "And does the remote work?");
    await sendMessage(ada.id, thread.id, "Last one: any scratches on the lid?");
    const jobs = await waiting(QUEUES.messageMail, "threadId", thread.id);
    expect(jobs).toHaveLength(1);
    expect(jobs[0].data).toEqual({ threadId: thread.id, recipientId: seller.id });
    expect(jobs[0].singletonKey).toBe(`thread:${thread.id}:${seller.id}`);
    // Deferred by the delay (the database's clock and ours agree within a few seconds here).
    expect(jobs[0].startAfter.getTime()).toBeGreaterThan(queuedAt + (MESSAGE_MAIL_DELAY_SECONDS - 30) * 1000);

    expect(await run()).toBe(1);
    expect(recipients(sent)).toEqual([seller.email]);
    expect(sent[0].subject).toContain("3 messages");
    for (const line of ["MM only", "remote work", "scratches on the lid"]) expect(sent[0].text).toContain(line);
    expect(sent[0].text).toContain(`/messages/${thread.id}`);
  });

  it("sends nothing twice, and nothing the recipient has already read", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    await sendMessage(ada.id, thread.id, "First question about the tuner.");
    await run();
    expect(sent).toHaveLength(1);
    // A doubled job (a retry after the mail went) finds nothing new.
    expect(await deliverMessageMail({ threadId: thread.id, recipientId: seller.id })).toBe(0);

    // The next burst mails only what is new; one the seller has already read is not mailed at all.
    await sendMessage(ada.id, thread.id, "Second question: is it the later revision?");
    await run();
    expect(sent).toHaveLength(2);
    expect(sent[1].text).toContain("Second question");
    expect(sent[1].text).not.toContain("First question");

    await sendMessage(ada.id, thread.id, "Third: read on the site before the mail goes.");
    await conversation(seller.id, thread.id, testClock(new Date(Date.now() + 1000)));
    await run();
    expect(sent).toHaveLength(2);
  });

  it("mails each side about the other's messages, never its own, and not what an answer shows was read", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    await sendMessage(ada.id, thread.id, "Can I collect on Saturday?");
    await run();
    expect(recipients(sent)).toEqual([seller.email]);
    await sendMessage(ada.id, thread.id, "Or Sunday, if that is easier.");
    // The seller answers before that mail went: answering is reading, so only Ada hears.
    await sendMessage(seller.id, thread.id, "Saturday morning suits.", testClock(new Date(Date.now() + 1000)));
    await run();
    expect(recipients(sent)).toEqual([seller.email, ada.email].sort());
    const toAda = sent.find((m) => m.to === ada.email);
    expect(toAda?.text).toContain("Saturday morning suits.");
    expect(toAda?.text).not.toContain("Can I collect");
  });
});
