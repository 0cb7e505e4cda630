import Stripe from "stripe";
import { env } from "~/env.server";
import { User } from "~/models/user.server";
import { ensurePayoutAccount } from "~/orders/provider.server";
import { accountCanBePaid, syncPayoutAccount } from "~/payments/payouts.server";
import { payments } from "~/services/payments.server";

// The demo sellers who can sell from the start: their payout accounts are connected at the local
// payments stand-in, through its own onboarding page, as a seller would. One private seller
// (seller2@) is left unconnected, so the demo also shows units that cannot be bought yet. Against the
// real provider nothing is done: onboarding there is a person's job.

const CONNECTED = ["workshop@loadline.test", "valves@loadline.test", "platters@loadline.test", "seller@loadline.test"];

export async function seedDemoPayouts(log: (line: string) => void = console.warn): Promise<{ connected: number }> {
  if (env().stripe.mode !== "fake") return { connected: 0 };
  try {
    return await connectDemoSellers();
  } catch (error) {
    // `npm run db:seed` without the stand-in running: everything else is seeded; a later start connects them.
    if (!(error instanceof Stripe.errors.StripeConnectionError)) throw error;
    log("The payments stand-in is not running: the demo sellers' payout accounts are left for the next start.");
    return { connected: 0 };
  }
}

async function connectDemoSellers(): Promise<{ connected: number }> {
  let connected = 0;
  for (const email of CONNECTED) {
    const user = await User.findOne({ where: { email } });
    if (!user) continue;
    if (user.payoutAccountId && (await usable(user.payoutAccountId))) {
      if (!user.payoutsEnabled) await syncPayoutAccount(user.payoutAccountId);
      continue;
    }
    // The stand-in's state was reset while the database was kept: start over with a new account.
    if (user.payoutAccountId) await user.update({ payoutAccountId: null, payoutsEnabled: false });
    const accountId = await ensurePayoutAccount(user);
    const link = await payments().accountLinks.create({
      account: accountId,
      type: "account_onboarding",
      return_url: `${env().appUrl}/account?payouts=back`,
    });
    const done = await fetch(link.url, {
      method: "POST",
      body: new URLSearchParams({ business_name: user.displayName, account_number: "GB00 DEMO 0000 0000 0000 00" }),
      redirect: "manual",
    });
    if (done.status !== 303) throw new Error(`The payments stand-in's onboarding answered ${done.status} for ${email}`);
    if (await syncPayoutAccount(accountId)) connected++;
  }
  return { connected };
}

async function usable(accountId: string): Promise<boolean> {
  try {
    return accountCanBePaid(await payments().accounts.retrieve(accountId));
  } catch (error) {
    if (error instanceof Stripe.errors.StripeInvalidRequestError && error.statusCode === 404) return false;
    throw error;
  }
}
