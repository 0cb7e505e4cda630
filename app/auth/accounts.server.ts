import { QueryTypes, UniqueConstraintError, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { User } from "~/models/user.server";
import { OAuthIdentity } from "~/models/oauth-identity.server";
import { normaliseRoles, type Role } from "~/auth/roles";
import { hashPassword, needsRehash, verifyPassword } from "~/auth/password.server";
import { checkSignInAllowed, recordSignInAttempt, tooManyAttemptsMessage } from "~/auth/rate-limit.server";
import { consumeToken, issueToken, recentTokenCount, TOKENS_PER_HOUR } from "~/auth/tokens.server";
import { sendAccountExistsEmail, sendVerificationEmail } from "~/auth/emails.server";
import { queueAccountMail } from "~/auth/account-mail.server";

/** One message for an unknown address and a wrong password alike, so it reveals neither. */
export const INVALID_CREDENTIALS = "That e-mail address and password do not match an account. Check both and try again.";
export const SUSPENDED = "This account is suspended, so it cannot sign in. Write to the moderators if you think this is a mistake.";

export type SignInFailure = "invalid" | "rate_limited" | "suspended";

/** Thrown by sign-in paths; `message` is safe to show as it is. */
export class SignInError extends Error {
  override name = "SignInError";
  constructor(
    readonly code: SignInFailure | "oauth_unverified",
    message: string,
    readonly retryAfterSeconds?: number,
  ) {
    super(message);
  }
}

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export class EmailTakenError extends Error {
  override name = "EmailTakenError";
}

/** Creates an account (sign-up, OAuth, the demo seed). Throws EmailTakenError for a used address. */
export async function createAccount(
  input: {
    email: string;
    displayName: string;
    password?: string | null;
    passwordHash?: string | null;
    roles?: readonly Role[];
    emailVerified?: boolean;
  },
  transaction?: Transaction,
): Promise<User> {
  const passwordHash = input.passwordHash ?? (input.password ? await hashPassword(input.password) : null);
  try {
    return await User.create(
      {
        email: normaliseEmail(input.email),
        displayName: input.displayName.trim(),
        passwordHash,
        roles: normaliseRoles(input.roles ?? []),
        emailVerifiedAt: input.emailVerified ? new Date() : null,
        lastSignInAt: null,
      },
      { transaction },
    );
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw new EmailTakenError("An account already uses that e-mail address.");
    throw error;
  }
}

export function findAccountByEmail(email: string, transaction?: Transaction) {
  return User.findOne({ where: { email: normaliseEmail(email) }, transaction });
}

/**
 * Sign-up. The request does the same work whether or not the address is taken: hash the password,
 * try the insert (in a savepoint, so a taken address does not spoil the transaction) and queue one
 * job beside it. The worker then mails a new account its confirmation link, or the owner of a taken
 * address a note (mailSignUp); the page says "check your inbox" either way.
 */
export async function registerAccount(input: { displayName: string; email: string; password: string }): Promise<void> {
  const passwordHash = await hashPassword(input.password);
  await sequelize.transaction(async (transaction) => {
    let created = false;
    try {
      await sequelize.transaction({ transaction }, (savepoint) => createAccount({ ...input, passwordHash }, savepoint));
      created = true;
    } catch (error) {
      if (!(error instanceof EmailTakenError)) throw error;
    }
    await queueAccountMail({ kind: "sign-up", email: normaliseEmail(input.email), created }, transaction);
  });
}

/** The worker's half of sign-up. A failed send throws, rolling the link back, and the job is retried. */
export async function mailSignUp(email: string, created: boolean): Promise<void> {
  const user = await findAccountByEmail(email);
  if (!user) return;
  if (!created) return noteSignUpAttempt(user);
  if (user.emailVerifiedAt) return;
  await sequelize.transaction(async (transaction) => {
    const token = await issueToken(user.id, "verify_email", transaction);
    await sendVerificationEmail(user, token);
  });
}

/** Tells an account's owner that someone tried to sign up with their address; at most once an hour. */
async function noteSignUpAttempt(account: User): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const [claimed] = await sequelize.query(
      `UPDATE users SET exists_notice_at = now()
        WHERE id = :id AND (exists_notice_at IS NULL OR exists_notice_at < now() - interval '1 hour')
        RETURNING id`,
      { replacements: { id: account.id }, type: QueryTypes.SELECT, transaction },
    );
    if (claimed) await sendAccountExistsEmail(account);
  });
}

/** Password sign-in with the rate limits; throws SignInError with a message fit to show. */
export async function passwordSignIn(email: string, password: string, address: string | null): Promise<User> {
  const decision = await checkSignInAllowed(email, address);
  if (!decision.allowed) {
    throw new SignInError("rate_limited", tooManyAttemptsMessage(decision.retryAfterSeconds), decision.retryAfterSeconds);
  }

  const user = await findAccountByEmail(email);
  const ok = await verifyPassword(password, user?.passwordHash);
  await recordSignInAttempt(email, address, ok);
  if (!ok || !user) throw new SignInError("invalid", INVALID_CREDENTIALS);
  // Only someone who knows the password learns that the account is suspended.
  if (user.status !== "active") throw new SignInError("suspended", SUSPENDED);

  const changes: Partial<Pick<User, "passwordHash" | "lastSignInAt">> = { lastSignInAt: new Date() };
  if (needsRehash(user.passwordHash!)) changes.passwordHash = await hashPassword(password);
  await user.update(changes);
  return user;
}

export type ConfirmResult = { ok: true; user: User } | { ok: false; reason: "unknown" | "expired" | "used" | "suspended" };

/** Uses an e-mail confirmation link: marks the address verified. */
export async function confirmEmail(token: string): Promise<ConfirmResult> {
  return sequelize.transaction(async (transaction): Promise<ConfirmResult> => {
    const state = await consumeToken(token, "verify_email", transaction);
    if (!state.ok) return state;
    const user = await User.findByPk(state.userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) return { ok: false, reason: "unknown" };
    if (!user.emailVerifiedAt) await user.update({ emailVerifiedAt: new Date() }, { transaction });
    if (user.status !== "active") return { ok: false, reason: "suspended" };
    await user.update({ lastSignInAt: new Date() }, { transaction });
    return { ok: true, user };
  });
}

export type ResendResult = "sent" | "already_verified" | "too_many";

/** Sends a fresh confirmation link to a signed-in account that has not confirmed its address. */
export async function resendVerification(userId: string): Promise<ResendResult> {
  const user = await User.findByPk(userId);
  if (!user) throw new Error(`account ${userId} not found`);
  if (user.emailVerifiedAt) return "already_verified";
  if ((await recentTokenCount(user.id, "verify_email")) >= TOKENS_PER_HOUR) return "too_many";
  await sequelize.transaction(async (transaction) => {
    const token = await issueToken(user.id, "verify_email", transaction);
    await sendVerificationEmail(user, token);
  });
  return "sent";
}

/** What the account page shows beyond the session user: how this account can sign in. */
export async function signInMethods(userId: string) {
  const [user, identities] = await Promise.all([
    User.findByPk(userId, { attributes: ["passwordHash", "createdAt"] }),
    OAuthIdentity.findAll({ where: { userId }, attributes: ["provider", "email"] }),
  ]);
  return {
    hasPassword: Boolean(user?.passwordHash),
    memberSince: user?.createdAt.toISOString() ?? null,
    providers: identities.map((i) => ({ provider: i.provider, email: i.email })),
  };
}
