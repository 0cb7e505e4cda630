import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { deliverAccountMail, linkToken, testEmail, TEST_EMAIL_PATTERN, type SentMail } from "./auth-support";
import { signedInAs, signedInCookie } from "../support/sessions";

// Sign-up, confirmation, password sign-in and password reset, against the real database. Account
// mail goes out from queued jobs, run here as the worker would; it is captured in memory so the
// links can be followed. The sign-in limits have their own suite (auth-sign-in-limits.test.ts).
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { User } = await import("~/models/user.server");
const accounts = await import("~/auth/accounts.server");
const { requestPasswordReset, resetPassword } = await import("~/auth/recovery.server");
const { inspectToken, consumeToken, issueToken } = await import("~/auth/tokens.server");

const PASSWORD = "warm-valves-hum";
const mailTo = (email: string) => sent.filter((m) => m.to === email);

beforeEach(() => {
  sent.length = 0;
});

afterAll(async () => {
  await sequelize.query(`DELETE FROM sign_in_attempts WHERE email LIKE :p OR address LIKE '192.0.2.%'`, {
    replacements: { p: TEST_EMAIL_PATTERN },
  });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

async function signUp(label: string) {
  const email = testEmail(label);
  await accounts.registerAccount({ displayName: `Tester ${label}`, email, password: PASSWORD });
  await deliverAccountMail();
  return email;
}

async function signInError(email: string, password: string, address: string | null = null) {
  try {
    await accounts.passwordSignIn(email, password, address);
  } catch (error) {
    return error as InstanceType<typeof accounts.SignInError>;
  }
  return null;
}

describe("sign-up and confirmation", () => {
  it("creates an unconfirmed buyer, stores only a hash of the password and of the link token", async () => {
    const email = await signUp("new");
    const user = await User.findOne({ where: { email } });
    expect(user).toMatchObject({ roles: ["buyer"], status: "active", emailVerifiedAt: null });
    expect(user!.passwordHash).toMatch(/^\$2[aby]\$/);
    expect(user!.passwordHash).not.toContain(PASSWORD);

    const [mail] = mailTo(email);
    expect(mail.subject).toMatch(/confirm your e-mail/i);
    const token = linkToken(mail, "/verify-email/");
    const [rows] = await sequelize.query(`SELECT token_hash FROM account_tokens WHERE user_id = :id`, {
      replacements: { id: user!.id },
    });
    expect(rows).toHaveLength(1);
    expect((rows as { token_hash: string }[])[0].token_hash).not.toBe(token);
  });

  it("confirms once; the link is then used up", async () => {
    const email = await signUp("confirm");
    const token = linkToken(mailTo(email)[0], "/verify-email/");
    const first = await accounts.confirmEmail(token);
    expect(first.ok).toBe(true);
    expect((await User.findOne({ where: { email } }))!.emailVerifiedAt).toBeInstanceOf(Date);
    expect(await accounts.confirmEmail(token)).toEqual({ ok: false, reason: "used" });
  });

  it("lets only one of two simultaneous uses of a link through", async () => {
    const email = await signUp("race");
    const token = linkToken(mailTo(email)[0], "/verify-email/");
    const results = await Promise.all([accounts.confirmEmail(token), accounts.confirmEmail(token)]);
    expect(results.filter((r) => r.ok)).toHaveLength(1);
  });

  it("refuses an expired link (confirmation links last 24 hours)", async () => {
    const email = await signUp("expired");
    const token = linkToken(mailTo(email)[0], "/verify-email/");
    await sequelize.query(
      `UPDATE account_tokens SET expires_at = now() - interval '1 second'
        WHERE user_id = (SELECT id FROM users WHERE email = :email)`,
      { replacements: { email } },
    );
    expect(await inspectToken(token, "verify_email")).toEqual({ ok: false, reason: "expired" });
    expect(await accounts.confirmEmail(token)).toEqual({ ok: false, reason: "expired" });
  });

  it("sets the lifetimes: 24 h to confirm, 1 h to reset", async () => {
    const email = await signUp("lifetimes");
    const user = (await User.findOne({ where: { email } }))!;
    await issueToken(user.id, "reset_password");
    const [rows] = await sequelize.query(
      `SELECT purpose, round(extract(epoch FROM expires_at - created_at) / 60) AS minutes
         FROM account_tokens WHERE user_id = :id ORDER BY purpose`,
      { replacements: { id: user.id } },
    );
    expect(rows).toEqual([
      { purpose: "reset_password", minutes: "60" },
      { purpose: "verify_email", minutes: "1440" },
    ]);
  });

  it("does not use a link for the wrong purpose", async () => {
    const email = await signUp("purpose");
    const token = linkToken(mailTo(email)[0], "/verify-email/");
    expect(await consumeToken(token, "reset_password")).toEqual({ ok: false, reason: "unknown" });
  });

  it("answers a sign-up with a taken address by mailing its owner, and changes nothing", async () => {
    const email = await signUp("taken");
    const before = (await User.findOne({ where: { email } }))!;
    sent.length = 0;
    await accounts.registerAccount({ displayName: "Impostor", email: email.toUpperCase(), password: "another-password" });
    expect(sent).toEqual([]); // nothing from the request itself
    await deliverAccountMail();
    expect(mailTo(email).map((m) => m.subject)).toEqual(["You already have a Loadline account"]);
    const after = (await User.findOne({ where: { email } }))!;
    expect(after.displayName).toBe(before.displayName);
    expect(after.passwordHash).toBe(before.passwordHash);
    // Repeating it within the hour sends nothing more: the form cannot flood the owner's inbox.
    await accounts.registerAccount({ displayName: "Impostor", email, password: "another-password" });
    await deliverAccountMail();
    expect(mailTo(email)).toHaveLength(1);
  });

  it("limits fresh confirmation links to three an hour", async () => {
    const email = await signUp("resend");
    const user = (await User.findOne({ where: { email } }))!;
    expect(await accounts.resendVerification(user.id)).toBe("sent");
    expect(await accounts.resendVerification(user.id)).toBe("sent");
    expect(await accounts.resendVerification(user.id)).toBe("too_many");
    expect(mailTo(email)).toHaveLength(3);
  });
});

describe("password sign-in", () => {
  it("signs in with the right password, whatever the address's case", async () => {
    const email = await signUp("signin");
    const user = await accounts.passwordSignIn(email.toUpperCase(), PASSWORD, null);
    expect(user.email).toBe(email);
    expect(user.lastSignInAt).toBeInstanceOf(Date);
  });

  it("gives the same message for a wrong password and an unknown address", async () => {
    const email = await signUp("same-message");
    const wrong = await signInError(email, "not-the-password");
    const unknown = await signInError(testEmail("nobody"), "not-the-password");
    expect(wrong?.code).toBe("invalid");
    expect(unknown?.message).toBe(wrong?.message);
    expect(wrong?.message).toBe(accounts.INVALID_CREDENTIALS);
  });

  it("refuses a suspended account, telling only someone who knows the password", async () => {
    const email = await signUp("suspended");
    await User.update({ status: "suspended" }, { where: { email } });
    expect((await signInError(email, "wrong-password"))?.code).toBe("invalid");
    expect((await signInError(email, PASSWORD))?.code).toBe("suspended");
  });
});

describe("password reset", () => {
  it("mails a link only when an account uses the address", async () => {
    const email = await signUp("reset-mail");
    sent.length = 0;
    await requestPasswordReset(email);
    await requestPasswordReset(testEmail("no-such-account"));
    expect(sent).toEqual([]); // the worker decides, not the request
    await deliverAccountMail();
    expect(sent.map((m) => m.to)).toEqual([email]);
    expect(sent[0].subject).toBe("Choose a new Loadline password");
  });

  it("sets the new password, confirms the address, ends other sessions and retires older links", async () => {
    const email = await signUp("reset");
    const before = (await User.findOne({ where: { email } }))!;
    const [phone, laptop] = [await signedInCookie(before), await signedInCookie(before)];
    await requestPasswordReset(email);
    await requestPasswordReset(email);
    await deliverAccountMail();
    const [older, newer] = mailTo(email)
      .filter((m) => /password/.test(m.subject))
      .map((m) => linkToken(m, "/reset-password/"));

    const result = await resetPassword(newer, "a-brand-new-password");
    expect(result.ok).toBe(true);
    const after = (await User.findOne({ where: { email } }))!;
    expect(await signedInAs(phone)).toBeNull();
    expect(await signedInAs(laptop)).toBeNull();
    expect(after.emailVerifiedAt).toBeInstanceOf(Date);
    expect(await resetPassword(older, "yet-another-password")).toEqual({ ok: false, reason: "used" });
    expect(await resetPassword(newer, "yet-another-password")).toEqual({ ok: false, reason: "used" });

    expect((await signInError(email, PASSWORD))?.code).toBe("invalid");
    expect(await signInError(email, "a-brand-new-password")).toBeNull();
  });

  it("refuses a reset link after its hour", async () => {
    const email = await signUp("reset-late");
    await requestPasswordReset(email);
    await deliverAccountMail();
    const token = linkToken(mailTo(email).at(-1), "/reset-password/");
    // Issued 61 minutes ago with the one-hour lifetime.
    await sequelize.query(
      `UPDATE account_tokens SET created_at = now() - interval '61 minutes', expires_at = now() - interval '1 minute'
        WHERE purpose = 'reset_password' AND user_id = (SELECT id FROM users WHERE email = :email)`,
      { replacements: { email } },
    );
    expect(await resetPassword(token, "too-late-password")).toEqual({ ok: false, reason: "expired" });
  });
});
