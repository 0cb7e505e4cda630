// Contact details in messages before a sale: e-mail addresses, phone numbers, web addresses and
// messenger handles are replaced, so a buyer is not led to pay outside Loadline's checkout, where the
// money is held until the unit has passed their audition. Pure and isomorphic: the server masks what
// it stores, the browser can warn while someone types. Figures and model codes must come through
// untouched ("XR-7700", "0.05 %", "230 V 50 Hz", "20 Hz – 20 kHz"), so numbers count as a phone only
// with enough digits and not when a unit follows.

export type ContactKind = "email" | "phone" | "url" | "handle";

export interface MaskResult {
  text: string;
  masked: boolean;
  kinds: ContactKind[];
}

export const MASK_TOKEN = "[contact details hidden]";

export const MASK_NOTE =
  "Contact details are hidden until the unit is paid for: buyers stay protected only inside Loadline's checkout, where the money is held until the unit has passed their audition.";

const TLDS = "com|net|org|info|biz|io|co|me|app|shop|online|store|eu|uk|de|fr|nl|be|at|ch|it|es|pt|se|no|dk|fi|pl|cz|ie|us|ca|au";

const EMAIL = /[A-Za-z0-9._%+-]+@[A-Za-z0-9-]+(?:\.[A-Za-z0-9-]+)*\.[A-Za-z]{2,}/g;
// "name (at) host (dot) com", "name at host dot com" (a known ending only, so prose is left alone).
const SPELLED_EMAIL = new RegExp(
  String.raw`[A-Za-z0-9._%+-]+\s*(?:[([{]\s*at\s*[)\]}]|\s+at\s+)\s*[A-Za-z0-9-]+\s*(?:(?:[([{]\s*dot\s*[)\]}]|\s+dot\s+|\.)\s*[A-Za-z0-9-]+\s*)*(?:[([{]\s*dot\s*[)\]}]|\s+dot\s+|\.)\s*(?:${TLDS})\b`,
  "gi",
);
const URL_WITH_SCHEME = /\b(?:https?:\/\/|www\.)[^\s<>"]+/gi;
// A bare host name with a known ending ("hifi-bench.de/contact"); "manual.pdf" or "0.05" do not end so.
const BARE_HOST = new RegExp(String.raw`\b(?:[A-Za-z0-9](?:[A-Za-z0-9-]*[A-Za-z0-9])?\.)+(?:${TLDS})\b(?:\/[^\s<>"]*)?`, "gi");
// Messenger names ("signal" and "line" are left out: both are everyday hi-fi words).
const APPS = String.raw`whats\s?app|telegram|viber|skype|wechat|instagram|insta|snapchat|facebook|messenger|kik|wa\.me|t\.me`;
const APP_HANDLE = new RegExp(String.raw`\b(?:${APPS})\b(?:\s*(?:me|on|at|is|:|-)?\s*:?\s*@?[A-Za-z0-9_.]*[0-9_@][A-Za-z0-9_.]*)?`, "gi");
const AT_HANDLE = /(?<![\w.@])@[A-Za-z][A-Za-z0-9_.]{2,}/g;
// Digits with the separators people type in phone numbers.
const PHONE_CANDIDATE = /(?<![\w.,])(?:\+|00)?\(?\d[\d\s().\-/]{6,}\d(?![\w])/g;
const UNIT_AFTER =
  /^\s*(?:[kKmMµu]?(?:Hz|V|W|A|Ω|ohms?|F|H)(?![A-Za-z])|%|dB|mm|cm|kg|g(?![A-Za-z])|ms|s(?![A-Za-z])|rpm|°|x(?![A-Za-z])|×)/;
const UNIT_BEFORE = /(?:[-–—]|\bto|\bx|×)\s*$/;

function digitCount(s: string): number {
  return (s.match(/\d/g) ?? []).length;
}

function isPhone(match: string, after: string, before: string): boolean {
  const digits = digitCount(match);
  const international = /^\s*(?:\+|00)/.test(match);
  if (digits < (international ? 8 : 9)) return false;
  // "20 - 20000 Hz", "2 x 100 W": a range or a figure, not a number to ring.
  if (UNIT_AFTER.test(after)) return false;
  if (UNIT_BEFORE.test(before) && !international) return false;
  // A date or a time stamp ("2026-12-30 14:00") is not a phone number either.
  if (/^\d{4}-\d{2}-\d{2}/.test(match.trim())) return false;
  return true;
}

/**
 * How much of a run of digits is a phone number: all of it, or less when the run swallowed a figure
 * that follows the number ("+44 7700 900123 2 x 50 W"), or none.
 */
function phoneLength(match: string, after: string, before: string): number {
  let end = match.length;
  for (;;) {
    const part = match.slice(0, end);
    if (isPhone(part, match.slice(end) + after, before)) return end;
    const cut = part.search(/[\s\-/]+[\d.]+$/);
    if (cut <= 0) return 0;
    end = cut;
  }
}

/** Masks contact details in `input`; `masked` says whether anything was replaced, `kinds` what. */
export function maskContactDetails(input: string): MaskResult {
  const kinds = new Set<ContactKind>();
  const replace = (text: string, pattern: RegExp, kind: ContactKind) =>
    text.replace(pattern, () => {
      kinds.add(kind);
      return MASK_TOKEN;
    });
  let text = input;
  text = replace(text, EMAIL, "email");
  text = replace(text, SPELLED_EMAIL, "email");
  text = replace(text, URL_WITH_SCHEME, "url");
  text = replace(text, APP_HANDLE, "handle");
  text = replace(text, BARE_HOST, "url");
  text = replace(text, AT_HANDLE, "handle");
  text = text.replace(PHONE_CANDIDATE, (match: string, offset: number, whole: string) => {
    const after = whole.slice(offset + match.length);
    const before = whole.slice(Math.max(0, offset - 6), offset);
    const length = phoneLength(match, after, before);
    if (length === 0) return match;
    kinds.add("phone");
    return MASK_TOKEN + match.slice(length);
  });
  return { text, masked: kinds.size > 0, kinds: [...kinds] };
}
