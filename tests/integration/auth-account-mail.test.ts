import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { accountMailJobs, deliverAccountMail, testEmail, TEST_EMAIL_PATTERN, type SentMail } from "./auth-support";
import { routeArgs } from "../support/route-args";

// "Forgot password" and sign-up through their route modules: an address with an account and one
// without get the same answer from the same work (one queued job, no mail, no lookup), and the
// worker alone decides what to send. The timing itself is measured by `npm run bench`.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { User } = await import("~/models/user.server");
const { createAccount } = await import("~/auth/accounts.server");
const forgotPassword = await import("~/routes/account/forgot-password");
const signUp = await import("~/routes/account/sign-up");

beforeEach(() => {
  sent.length = 0;
});

afterAll(async () => {
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

function form(path: string, fields: Record<string, string>) {
  const request = new Request(`http://127.0.0.1${path}`, {
    method: "POST",
    body: new URLSearchParams(fields),
    headers: { "Content-Type": "application/x-www-form-urlencoded" },
  });
  return routeArgs(request, {});
}

/** The SQL statements a piece of work sends through Sequelize, as "VERB table", to compare two paths. */
async function statements(run: () => Promise<unknown>): Promise<string[]> {
  const seen: string[] = [];
  const settings = (sequelize as unknown as { options: { logging: unknown } }).options;
  settings.logging = (sql: string) => {
    const text = sql.replace(/^Executing \([^)]*\):\s*/, "");
    const m = /^(\w+)\s[\s\S]*?\b(?:FROM|INTO|UPDATE)\s+"?(\w+)"?/i.exec(text);
    seen.push(m ? `${m[1].toUpperCase()} ${m[2]}` : text.split(/\s/)[0].toUpperCase());
  };
  try {
    await run();
  } finally {
    settings.logging = false;
  }
  return seen;
}

describe("forgot password", () => {
  it("answers an address with an account and one without alike: one job each, no mail from the request", async () => {
    const known = (
      await createAccount({ email: testEmail("forgot-known"), displayName: "Kim", password: "old-password-here", emailVerified: true })
    ).email;
    const unknown = testEmail("forgot-unknown");

    const answers = [];
    const work = [];
    for (const email of [known, unknown]) {
      let answer: unknown;
      work.push(await statements(async () => (answer = await forgotPassword.action(form("/forgot-password", { email })))));
      answers.push(answer);
    }
    expect(answers[0]).toEqual({ sent: true, email: known });
    expect(answers[1]).toEqual({ sent: true, email: unknown });
    // The request does not look the address up: the same statements either way.
    expect(work[0]).toEqual(work[1]);
    expect(work[0].some((s) => /users/.test(s))).toBe(false);
    expect(await accountMailJobs({ email: known })).toEqual([{ kind: "password-reset", email: known }]);
    expect(await accountMailJobs({ email: unknown })).toEqual([{ kind: "password-reset", email: unknown }]);
    expect(sent).toEqual([]);

    // The worker mails the account's owner, and nobody else.
    await deliverAccountMail();
    expect(sent.map((m) => [m.to, m.subject])).toEqual([[known, "Choose a new Loadline password"]]);
  });
});

describe("sign-up", () => {
  it("answers a new address and a taken one alike: one job each, no mail from the request", async () => {
    const taken = (
      await createAccount({ email: testEmail("signup-taken"), displayName: "Tam", password: "owners-password", emailVerified: true })
    ).email;
    const fresh = testEmail("signup-fresh");
    const answers = [];
    const work = [];
    for (const email of [taken, fresh]) {
      let answer: unknown;
      const fields = { displayName: "Someone", email, password: "a-long-enough-password" };
      work.push(await statements(async () => (answer = await signUp.action(form("/sign-up", fields)))));
      answers.push(answer);
    }
    expect(answers[0]).toEqual({ sent: true, email: taken });
    expect(answers[1]).toEqual({ sent: true, email: fresh });
    // Both try the insert and queue a job; only the savepoint's ending differs.
    const comparable = (w: string[]) => w.filter((s) => !/^(RELEASE|ROLLBACK)/i.test(s));
    expect(comparable(work[0])).toEqual(comparable(work[1]));
    expect(work[0].filter((s) => /^INSERT users/.test(s))).toHaveLength(1);
    expect(await accountMailJobs({ email: taken })).toEqual([{ kind: "sign-up", email: taken, created: false }]);
    expect(await accountMailJobs({ email: fresh })).toEqual([{ kind: "sign-up", email: fresh, created: true }]);
    expect(sent).toEqual([]);

    // The taken address's owner hears of it; nothing changed on their account.
    const owner = (await User.findOne({ where: { email: taken } }))!;
    expect(owner.displayName).toBe("Tam");
    await deliverAccountMail();
    expect(sent.map((m) => [m.to, m.subject])).toHaveLength(2);
    expect(sent.map((m) => [m.to, m.subject])).toEqual(
      expect.arrayContaining([
        [taken, "You already have a Loadline account"],
        [fresh, "Confirm your e-mail address for Loadline"],
      ]),
    );
  });
});
