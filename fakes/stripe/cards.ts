// Stripe's documented test cards (docs.stripe.com/testing) and test PaymentMethod ids, with the
// outcome each one produces. Messages follow Stripe's wording for the same decline codes (from memory).

export interface Card {
  brand: string;
  funding: "credit" | "debit";
  last4: string;
}

export type Outcome = { ok: true } | { ok: false; code: string; decline_code?: string; message: string; param?: string };

const approved: Outcome = { ok: true };
const declined = (decline_code: string, message = "Your card was declined."): Outcome => ({
  ok: false,
  code: "card_declined",
  decline_code,
  message,
});

const TEST_CARDS: Record<string, { card: Omit<Card, "last4">; outcome: Outcome }> = {
  "4242424242424242": { card: { brand: "visa", funding: "credit" }, outcome: approved },
  "4000056655665556": { card: { brand: "visa", funding: "debit" }, outcome: approved },
  "5555555555554444": { card: { brand: "mastercard", funding: "credit" }, outcome: approved },
  "2223003122003222": { card: { brand: "mastercard", funding: "credit" }, outcome: approved },
  "5200828282828210": { card: { brand: "mastercard", funding: "debit" }, outcome: approved },
  "378282246310005": { card: { brand: "amex", funding: "credit" }, outcome: approved },
  "6011111111111117": { card: { brand: "discover", funding: "credit" }, outcome: approved },
  "4000000000000077": { card: { brand: "visa", funding: "credit" }, outcome: approved },
  "4000000000000002": { card: { brand: "visa", funding: "credit" }, outcome: declined("generic_decline") },
  "4000000000009995": {
    card: { brand: "visa", funding: "credit" },
    outcome: declined("insufficient_funds", "Your card has insufficient funds."),
  },
  "4000000000009987": { card: { brand: "visa", funding: "credit" }, outcome: declined("lost_card") },
  "4000000000009979": { card: { brand: "visa", funding: "credit" }, outcome: declined("stolen_card") },
  "4100000000000019": { card: { brand: "visa", funding: "credit" }, outcome: declined("fraudulent") },
  "4000000000000069": {
    card: { brand: "visa", funding: "credit" },
    outcome: { ok: false, code: "expired_card", decline_code: "expired_card", message: "Your card has expired.", param: "exp_month" },
  },
  "4000000000000127": {
    card: { brand: "visa", funding: "credit" },
    outcome: {
      ok: false,
      code: "incorrect_cvc",
      decline_code: "incorrect_cvc",
      message: "Your card's security code is incorrect.",
      param: "cvc",
    },
  },
  "4000000000000119": {
    card: { brand: "visa", funding: "credit" },
    outcome: {
      ok: false,
      code: "processing_error",
      decline_code: "processing_error",
      message: "An error occurred while processing your card. Try again in a little bit.",
    },
  },
};

const TEST_PAYMENT_METHODS: Record<string, string> = {
  pm_card_visa: "4242424242424242",
  pm_card_visa_debit: "4000056655665556",
  pm_card_mastercard: "5555555555554444",
  pm_card_amex: "378282246310005",
  pm_card_discover: "6011111111111117",
  pm_card_bypassPending: "4000000000000077",
  pm_card_chargeDeclined: "4000000000000002",
  pm_card_chargeDeclinedInsufficientFunds: "4000000000009995",
  pm_card_chargeDeclinedLostCard: "4000000000009987",
  pm_card_chargeDeclinedStolenCard: "4000000000009979",
  pm_card_chargeDeclinedFraudulent: "4100000000000019",
  pm_card_chargeDeclinedExpiredCard: "4000000000000069",
  pm_card_chargeDeclinedIncorrectCvc: "4000000000000127",
  pm_card_chargeDeclinedProcessingError: "4000000000000119",
};

export function luhnValid(number: string): boolean {
  let sum = 0;
  for (let i = 0; i < number.length; i++) {
    let d = Number(number[number.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return number.length >= 12 && sum % 10 === 0;
}

export interface CardCheck {
  card: Card;
  outcome: Outcome;
}

/** What happens when this number is charged in test mode; null when the number itself is malformed. */
export function chargeCardNumber(raw: string): CardCheck | { error: string } {
  const number = raw.replace(/[\s-]/g, "");
  if (!/^\d{12,19}$/.test(number) || !luhnValid(number)) return { error: "Your card number is incorrect." };
  const known = TEST_CARDS[number];
  const last4 = number.slice(-4);
  if (known) return { card: { ...known.card, last4 }, outcome: known.outcome };
  return {
    card: { brand: number.startsWith("4") ? "visa" : "unknown", funding: "credit", last4 },
    outcome: declined(
      "test_mode_live_card",
      "Your card was declined. Your request was in test mode, but used a non test card. Use one of the documented test cards.",
    ),
  };
}

export function testPaymentMethodNumber(id: string): string | undefined {
  return TEST_PAYMENT_METHODS[id];
}

export function cvcLength(brand: string): number {
  return brand === "amex" ? 4 : 3;
}
