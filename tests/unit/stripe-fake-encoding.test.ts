import { describe, expect, it } from "vitest";
import Stripe from "stripe";
import { parseStripeParams } from "../../fakes/stripe/form";
import { signatureHeader } from "../../fakes/stripe/webhooks";
import { chargeCardNumber, luhnValid } from "../../fakes/stripe/cards";

// The payments stand-in's wire details, checked against the SDK's own encoder and signer.
describe("payments stand-in encoding", () => {
  it("reads bracketed form parameters as the SDK writes them", () => {
    const params = parseStripeParams(
      "line_items[1][quantity]=2&line_items[0][price_data][unit_amount]=64900&line_items[0][quantity]=1" +
        "&metadata[order]=o-5&expand[]=payment_intent&expand[]=line_items&payment_intent_data[capture_method]=manual",
    );
    expect(params).toEqual({
      line_items: [{ price_data: { unit_amount: "64900" }, quantity: "1" }, { quantity: "2" }],
      metadata: { order: "o-5" },
      expand: ["payment_intent", "line_items"],
      payment_intent_data: { capture_method: "manual" },
    });
  });

  it("signs webhook payloads exactly as the SDK's test signer does (HMAC-SHA256 over `t.body`)", () => {
    // The provider's webhook signature docs: v1 = hex HMAC-SHA256(secret, "{t}.{raw body}").
    const payload = JSON.stringify({ id: "evt_1", object: "event", type: "account.updated" });
    const timestamp = 1_796_000_000;
    const ours = signatureHeader(payload, "whsec_unit", timestamp);
    expect(ours).toBe(Stripe.webhooks.generateTestHeaderString({ payload, secret: "whsec_unit", timestamp }));
    expect(() => Stripe.webhooks.constructEvent(payload, ours, "whsec_unit", Number.MAX_SAFE_INTEGER)).not.toThrow();
  });

  it("gives the documented test cards their documented outcomes (docs.stripe.com/testing)", () => {
    expect(chargeCardNumber("4242 4242 4242 4242")).toMatchObject({ card: { brand: "visa", last4: "4242" }, outcome: { ok: true } });
    expect(chargeCardNumber("4000000000000002")).toMatchObject({
      outcome: { ok: false, code: "card_declined", decline_code: "generic_decline" },
    });
    expect(chargeCardNumber("4000000000009995")).toMatchObject({ outcome: { ok: false, decline_code: "insufficient_funds" } });
    expect(chargeCardNumber("4242424242424241")).toEqual({ error: "Your card number is incorrect." });
    // Luhn check digit (ISO/IEC 7812-1 Annex B, from memory): one changed digit breaks it.
    expect(luhnValid("4111111111111111")).toBe(true);
    expect(luhnValid("4111111111111112")).toBe(false);
  });
});
