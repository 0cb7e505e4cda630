import type Stripe from "stripe";
import { User } from "~/models/user.server";
import { onboardingLink } from "~/orders/provider.server";
import { payments } from "~/services/payments.server";

// A seller's payout account: an Express-style connected account at the provider, onboarded on the
// provider's own page. users.payouts_enabled follows the account (the account.updated webhook, or
// the check when the seller comes back from onboarding); a seller without it cannot be bought from.

export interface PayoutStatus {
  connected: boolean;
  enabled: boolean;
}

export function payoutStatus(user: Pick<User, "payoutAccountId" | "payoutsEnabled">): PayoutStatus {
  return { connected: Boolean(user.payoutAccountId), enabled: user.payoutsEnabled };
}

/** Where to send the seller to connect (or finish connecting) their payout account. */
export async function startPayoutOnboarding(userId: string, returnUrl: string): Promise<string> {
  const user = await User.findByPk(userId, { rejectOnEmpty: true });
  return onboardingLink(user, returnUrl);
}

/** Whether the provider lets this account receive transfers and pay out. */
export function accountCanBePaid(account: Stripe.Account): boolean {
  return account.payouts_enabled === true && account.capabilities?.transfers === "active";
}

/** Reads the account afresh and sets its owner's payouts_enabled; returns it (false for no owner). */
export async function syncPayoutAccount(accountId: string): Promise<boolean> {
  const user = await User.findOne({ where: { payoutAccountId: accountId } });
  if (!user) return false;
  const enabled = accountCanBePaid(await payments().accounts.retrieve(accountId));
  if (user.payoutsEnabled !== enabled) await user.update({ payoutsEnabled: enabled });
  return enabled;
}

/** The account's payout status; with `refresh` (back from onboarding) the provider is asked now rather than waiting for the webhook. */
export async function payoutStatusFor(userId: string, { refresh = false } = {}): Promise<PayoutStatus> {
  const user = await User.findByPk(userId, { rejectOnEmpty: true, attributes: ["id", "payoutAccountId", "payoutsEnabled"] });
  if (refresh && user.payoutAccountId) {
    try {
      user.payoutsEnabled = await syncPayoutAccount(user.payoutAccountId);
    } catch (error) {
      console.error("[payouts] could not read the payout account", error); // the webhook brings it later
    }
  }
  return payoutStatus(user);
}
