import { z } from "zod";
import { parsePrice } from "@shared/listing-input";
import { isCurrency } from "@shared/listing-input";
import { idSchema } from "@shared/ids";
import { HttpError, pageError } from "~/http/errors.server";
import { Listing } from "~/models/index.server";
import type { Role } from "~/auth/roles";
import { answerOffer, makeOffer } from "~/offers/offers.server";
import { threadFor } from "./access.server";
import { MessageInputSchema } from "./schemas";
import { sendMessage } from "./threads.server";
import type { ThreadFormErrors } from "./ui/ThreadView";

// The thread page's forms without JavaScript: send a message, make an offer, answer one. Amounts are
// typed as prices ("420", "1,250.00") in the listing's currency and become integer minor units here.
// A refusal the person can fix comes back beside its field; anything else is the error page.

export type ThreadActionOutcome = { ok: true } | { ok: false; status: number; errors: ThreadFormErrors; draft?: string };

const AnswerForm = z.object({
  offerId: idSchema("offer"),
  answer: z.enum(["accept", "decline", "counter", "withdraw"]),
  amount: z.string().optional(),
});

export async function threadAction(
  user: { id: string; roles: readonly Role[] },
  threadId: string,
  form: Record<string, FormDataEntryValue>,
): Promise<ThreadActionOutcome> {
  const text = (k: string) => (typeof form[k] === "string" ? form[k] : "");
  try {
    const { thread } = await threadFor(user.id, threadId);
    const listing = await Listing.findByPk(thread.listingId, { attributes: ["currency"] });
    const currency = listing && isCurrency(listing.currency) ? listing.currency : null;
    switch (text("intent")) {
      case "send": {
        const parsed = MessageInputSchema.safeParse({ body: text("body") });
        if (!parsed.success) return { ok: false, status: 400, errors: { body: parsed.error.issues[0]?.message }, draft: text("body") };
        await sendMessage(user.id, thread.id, parsed.data.body);
        return { ok: true };
      }
      case "offer": {
        if (!currency) return { ok: false, status: 409, errors: { amount: "This unit has no price to offer against." } };
        const amount = parsePrice(text("amount"), currency);
        if (!amount.ok) return { ok: false, status: 400, errors: { amount: amount.message } };
        try {
          await makeOffer(user, { listingId: thread.listingId, amountMinor: amount.value, currency });
        } catch (error) {
          if (error instanceof HttpError && error.status < 500 && error.status !== 404)
            return { ok: false, status: error.status, errors: { amount: error.message } };
          throw error;
        }
        return { ok: true };
      }
      case "answer": {
        const parsed = AnswerForm.safeParse(form);
        if (!parsed.success) return { ok: false, status: 400, errors: {} };
        const { offerId, answer } = parsed.data;
        let input: Parameters<typeof answerOffer>[2];
        if (answer === "counter") {
          if (!currency) return { ok: false, status: 409, errors: {} };
          const amount = parsePrice(parsed.data.amount ?? "", currency);
          if (!amount.ok) return { ok: false, status: 400, errors: { counter: { offerId, message: amount.message } } };
          input = { action: "counter", amountMinor: amount.value, currency };
        } else input = { action: answer };
        try {
          await answerOffer(user.id, offerId, input);
        } catch (error) {
          if (error instanceof HttpError && error.status < 500 && error.status !== 404) {
            const where = answer === "counter" && error.code === "invalid" ? "counter" : "offer";
            return { ok: false, status: error.status, errors: { [where]: { offerId, message: error.message } } };
          }
          throw error;
        }
        return { ok: true };
      }
      default:
        return { ok: false, status: 400, errors: {} };
    }
  } catch (error) {
    pageError(error);
  }
}
