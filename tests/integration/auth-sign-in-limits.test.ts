import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { accountMailJobs, deliverAccountMail, testEmail, TEST_EMAIL_PATTERN, type SentMail } from "./auth-support";

// The sign-in limits against the real database: guessing is slowed per address, per account and
// address, and per account with growing delays, while the owner is never locked out of their own
// address by someone elsewhere, and hears about repeated failures once.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const accounts = await import("~/auth/accounts.server");
const { SIGN_IN_LIMITS: L } = await import("~/auth/rate-limit.server");

const PASSWORD = "matched-pair-output";
let net = 0;
/** A fresh block of TEST-NET-2 addresses (RFC 5737) per test, so tests never share a bucket. */
function addresses() {
  const block = net++;
  return (i: number) => `198.51.100.${block * 40 + i}`;
}

beforeEach(() => {
  sent.length = 0;
});

afterAll(async () => {
  await sequelize.query(`DELETE FROM sign_in_attempts WHERE email LIKE :p OR address LIKE '198.51.100.%'`, {
    replacements: { p: TEST_EMAIL_PATTERN },
  });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

async function owner(label: string) {
  const user = await accounts.createAccount({
    email: testEmail(label),
    displayName: `Owner ${label}`,
    password: PASSWORD,
    emailVerified: true,
  });
  return user.email;
}

async function attempt(email: string, password: string, address: string | null) {
  try {
    await accounts.passwordSignIn(email, password, address);
    return { code: "ok" as const, message: "", retryAfterSeconds: 0 };
  } catch (error) {
    if (!(error instanceof accounts.SignInError)) throw error;
    return { code: error.code, message: error.message, retryAfterSeconds: error.retryAfterSeconds ?? 0 };
  }
}

/** Failures from many addresses at once, written as the attempt log records them. */
async function failuresFromElsewhere(email: string, count: number) {
  await sequelize.query(
    `INSERT INTO sign_in_attempts (email, address, succeeded, attempted_at)
     SELECT :email, '203.0.113.' || n, false, now() - make_interval(secs => n) FROM generate_series(1, :count) AS n`,
    { replacements: { email, count } },
  );
}

describe("per account and address", () => {
  it("five wrong passwords from one address do not lock the owner out of another; the guesser is refused; the owner is told once", async () => {
    const email = await owner("locked-out");
    const at = addresses();
    const [guesser, home] = [at(1), at(2)];
    for (let i = 0; i < L.perAccountAndAddress; i++) expect((await attempt(email, `guess-${i}`, guesser)).code).toBe("invalid");

    // The guesser's address is refused now, even with the right password.
    const refused = await attempt(email, PASSWORD, guesser);
    expect(refused.code).toBe("rate_limited");
    expect(refused.message).toBe("Too many sign-in attempts; try again in 15 minutes.");

    // The owner, from their own address, signs in.
    expect((await attempt(email, PASSWORD, home)).code).toBe("ok");

    // One warning queued, not one per failure, and nothing sent from the requests themselves.
    const user = (await accounts.findAccountByEmail(email))!;
    expect(await accountMailJobs({ userId: user.id })).toEqual([{ kind: "sign-in-warning", userId: user.id }]);
    expect(sent).toEqual([]);
    for (let i = 0; i < 3; i++) await attempt(email, `more-${i}`, at(3 + i));
    expect(await accountMailJobs({ userId: user.id })).toHaveLength(1);

    await deliverAccountMail();
    expect(sent.map((m) => [m.to, m.subject])).toEqual([[email, "Failed sign-ins to your Loadline account"]]);
    expect(sent[0].text).toContain(`a wrong password for your Loadline account ${L.perAccountAndAddress + 3} times, from 4 addresses`);
  });

  it("lets the address try again once its oldest failure leaves the window", async () => {
    const email = await owner("window");
    const at = addresses();
    for (let i = 0; i < L.perAccountAndAddress; i++) await attempt(email, `guess-${i}`, at(1));
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("rate_limited");
    await sequelize.query(
      `UPDATE sign_in_attempts SET attempted_at = now() - make_interval(mins => :minutes + 1)
        WHERE id = (SELECT min(id) FROM sign_in_attempts WHERE email = :email)`,
      { replacements: { email, minutes: L.windowMinutes } },
    );
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
  });

  it("forgives that address's earlier failures after it signs in", async () => {
    const email = await owner("forgive");
    const at = addresses();
    for (let i = 0; i < L.perAccountAndAddress - 1; i++) await attempt(email, `typo-${i}`, at(1));
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
    for (let i = 0; i < L.perAccountAndAddress - 1; i++) await attempt(email, `typo-again-${i}`, at(1));
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
  });

  it("counts addresses without an account the same way, so the limit does not reveal which exist", async () => {
    const ghost = testEmail("ghost");
    const at = addresses();
    for (let i = 0; i < L.perAccountAndAddress; i++) expect((await attempt(ghost, `guess-${i}`, at(1))).code).toBe("invalid");
    expect((await attempt(ghost, "anything", at(1))).code).toBe("rate_limited");
    expect((await attempt(ghost, "anything", at(2))).code).toBe("invalid");
  });
});

describe("per address", () => {
  it(`stops an address after ${L.perAddress} failures across many accounts; other addresses are unaffected`, async () => {
    const at = addresses();
    for (let i = 0; i < L.perAddress; i++) await attempt(testEmail(`spray-${i}`), "guess", at(1));
    const email = await owner("sprayed");
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("rate_limited");
    expect((await attempt(email, PASSWORD, at(2))).code).toBe("ok");
  });
});

describe("per account, from every address together", () => {
  it("slows new addresses with delays that double per failure, up to a ceiling", async () => {
    const email = await owner("botnet");
    const at = addresses();
    await failuresFromElsewhere(email, L.accountDelayAfter - 1);
    // Below the threshold nothing waits.
    expect((await attempt(email, "guess", at(1))).code).toBe("invalid");
    // 16 failures: 2^6 s after the latest; 18: 2^8 s.
    await failuresFromElsewhere(email, 6);
    const first = await attempt(email, PASSWORD, at(2));
    expect(first.code).toBe("rate_limited");
    expect(first.retryAfterSeconds).toBeGreaterThan(32);
    expect(first.retryAfterSeconds).toBeLessThanOrEqual(64);
    await failuresFromElsewhere(email, 2);
    const later = await attempt(email, PASSWORD, at(3));
    expect(later.code).toBe("rate_limited");
    expect(later.retryAfterSeconds).toBeGreaterThan(128);
    expect(later.retryAfterSeconds).toBeLessThanOrEqual(256);

    await failuresFromElsewhere(email, 200);
    const capped = await attempt(email, PASSWORD, at(4));
    expect(capped.code).toBe("rate_limited");
    expect(capped.retryAfterSeconds).toBeGreaterThan(L.accountMaxDelaySeconds / 2);
    expect(capped.retryAfterSeconds).toBeLessThanOrEqual(L.accountMaxDelaySeconds);
    expect(capped.message).toBe("Too many sign-in attempts; try again in 5 minutes.");
  });

  it("never delays an address the account has signed in from before", async () => {
    const email = await owner("known-home");
    const at = addresses();
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
    await failuresFromElsewhere(email, 250);
    expect((await attempt(email, PASSWORD, at(2))).code).toBe("rate_limited");
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
    // A wrong password from home is still just wrong, not a lock.
    expect((await attempt(email, "typo", at(1))).code).toBe("invalid");
    expect((await attempt(email, PASSWORD, at(1))).code).toBe("ok");
  });
});
