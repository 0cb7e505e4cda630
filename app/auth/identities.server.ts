import { UniqueConstraintError } from "sequelize";
import { sequelize } from "~/db.server";
import { User } from "~/models/user.server";
import { OAuthIdentity } from "~/models/oauth-identity.server";
import { createAccount, normaliseEmail, SignInError, SUSPENDED } from "~/auth/accounts.server";
import { revokeAllSessions } from "~/auth/session-store.server";

export interface ProviderProfile {
  provider: string;
  subject: string;
  email: string;
  emailVerified: boolean;
  name?: string | null;
}

export const OAUTH_UNVERIFIED =
  "The e-mail address on your Loadline pass is not confirmed yet, so it cannot sign you in here. Confirm it there, or sign in with your password.";

/**
 * The account for an outside identity: the one already linked to it; else the account with the same
 * e-mail address, if the provider vouches for that address; else a new account.
 */
export async function signInWithIdentity(profile: ProviderProfile): Promise<User> {
  try {
    return await linkOrCreate(profile);
  } catch (error) {
    // Two callbacks for one new identity at once: the second finds what the first created.
    if (error instanceof UniqueConstraintError) return linkOrCreate(profile);
    throw error;
  }
}

async function linkOrCreate(profile: ProviderProfile): Promise<User> {
  const email = normaliseEmail(profile.email);
  const user = await sequelize.transaction(async (transaction) => {
    const linked = await OAuthIdentity.findOne({
      where: { provider: profile.provider, subject: profile.subject },
      transaction,
    });
    if (linked) {
      const user = await User.findByPk(linked.userId, { transaction });
      if (user) {
        if (linked.email !== email) await linked.update({ email }, { transaction });
        return user;
      }
    }
    if (!profile.emailVerified) throw new SignInError("oauth_unverified", OAUTH_UNVERIFIED);

    let user = await User.findOne({ where: { email }, transaction, lock: transaction.LOCK.UPDATE });
    if (user && !user.emailVerifiedAt) {
      // Someone may have signed this address up without owning it. The provider has now shown who
      // owns it, so the unconfirmed password is dropped and any session made with it ends.
      await user.update({ emailVerifiedAt: new Date(), passwordHash: null }, { transaction });
      await revokeAllSessions(user.id, transaction);
    }
    user ??= await createAccount({ email, displayName: profile.name?.trim() || email.split("@")[0], emailVerified: true }, transaction);
    await OAuthIdentity.create({ userId: user.id, provider: profile.provider, subject: profile.subject, email }, { transaction });
    return user;
  });
  if (user.status !== "active") throw new SignInError("suspended", SUSPENDED);
  await user.update({ lastSignInAt: new Date() });
  return user;
}
