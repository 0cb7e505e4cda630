import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MASK_TOKEN, maskContactDetails } from "@shared/contact-mask";

// Contact details typed before a sale are hidden; the figures and model codes a hi-fi conversation
// is made of are not.

const masks = (s: string) => maskContactDetails(s);

describe("maskContactDetails: what it hides", () => {
  it.each([
    ["Write to ada.lindqvist+hifi@example.test for photos", "email"],
    ["mail: ada (at) example (dot) com", "email"],
    ["ada at example dot de", "email"],
    ["Ring me on 07700 900123 after six", "phone"],
    ["+44 7700 900123", "phone"],
    ["0049 (0)30 1234 5678", "phone"],
    ["call 030/123 456 78", "phone"],
    ["see https://hifi-bench.example/ada?x=1", "url"],
    ["www.oskerfeld-audio.example", "url"],
    ["my shop page is oskerfeld-audio.de/contact", "url"],
    ["WhatsApp me: +44 7700 900123", "handle"],
    ["whatsapp 07700900123", "handle"],
    ["find me on telegram @ada_hifi", "handle"],
    ["insta: ada_restores", "handle"],
    ["wa.me/447700900123", "handle"],
  ])("%s", (input, kind) => {
    const result = masks(input);
    expect(result.masked).toBe(true);
    expect(result.kinds).toContain(kind);
    expect(result.text).toContain(MASK_TOKEN);
    expect(result.text).not.toMatch(/7700 900123|example\.test|hifi-bench|oskerfeld-audio|ada_hifi|ada_restores|@ada/);
  });

  it("keeps the words around what it hides", () => {
    expect(masks("Ring me on 07700 900123 after six").text).toBe(`Ring me on ${MASK_TOKEN} after six`);
    expect(masks("Mail ada@example.test, thanks").text).toBe(`Mail ${MASK_TOKEN}, thanks`);
  });
});

describe("maskContactDetails: what it leaves alone", () => {
  it.each([
    "Is the XR-7700 the later revision?",
    "THD was 0.05 % at 1 kHz into 8 Ω",
    "It runs on 230 V 50 Hz; the 115 V tap is unused",
    "Response 20 Hz – 20 kHz ±0.5 dB",
    "20 - 20000 Hz",
    "2 x 100 W into 8 ohms, 2 x 160 W into 4 ohms",
    "Measured on 2026-12-30 14:00 after a 30 min warm-up",
    "Signal-to-noise 96 dB; the signal path was recapped",
    "The manual.pdf scan is in the photos; model TA-6200 MkII, serial on the back",
    "Price 1 250 EUR, weighs 31 kg, boxed 620 x 480 x 250 mm",
    "Bias set to 35 mA per tube at 1.2 V across 33 Ω",
    "Can you meet at the station, or at my bench?",
    "Wow and flutter 0.04 % WRMS, speed error 0.3 %",
  ])("%s", (input) => {
    expect(masks(input)).toEqual({ text: input, masked: false, kinds: [] });
  });
});

// Technical phrases of the trade, put together at random.
const figure = fc.oneof(
  fc
    .tuple(fc.integer({ min: 1, max: 9999 }), fc.constantFrom("W", "V", "Hz", "kHz", "dB", "Ω", "ohms", "mA", "%", "kg", "mm", "rpm"))
    .map(([n, u]) => `${n} ${u}`),
  fc
    .tuple(fc.integer({ min: 0, max: 99 }), fc.integer({ min: 1, max: 999 }), fc.constantFrom("%", "dB", "V", "W"))
    .map(([a, b, u]) => `${a}.${b} ${u}`),
  fc.tuple(fc.constantFrom("XR", "TA", "MkII", "FW", "LX", "PA"), fc.integer({ min: 10, max: 99999 })).map(([p, n]) => `${p}-${n}`),
  fc.tuple(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 10, max: 500 })).map(([a, b]) => `${a} x ${b} W`),
  fc.tuple(fc.integer({ min: 5, max: 50 }), fc.integer({ min: 10, max: 50 })).map(([a, b]) => `${a} Hz – ${b} kHz`),
  fc.constantFrom("the", "bias", "recapped", "valves", "serviced", "into", "at", "signal", "channel", "left", "right", "and", "with"),
);
const technicalText = fc.array(figure, { minLength: 1, maxLength: 12 }).map((parts) => parts.join(" "));

const email = fc
  .tuple(
    fc.stringMatching(/^[a-z][a-z0-9._]{1,12}$/),
    fc.stringMatching(/^[a-z][a-z0-9-]{1,10}[a-z0-9]$/),
    fc.constantFrom("com", "de", "example", "test", "co.uk"),
  )
  .map(([user, host, tld]) => `${user}@${host}.${tld}`);
const phone = fc
  .tuple(
    fc.constantFrom("+44 ", "0", "+49 ", "0044 "),
    fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 9, maxLength: 11 }),
    fc.constantFrom(" ", "-", ""),
  )
  .map(([prefix, digits, sep]) => prefix + [digits.slice(0, 4).join(""), digits.slice(4).join("")].join(sep));
const url = fc
  .tuple(
    fc.constantFrom("https://", "http://", "www."),
    fc.stringMatching(/^[a-z][a-z0-9-]{1,10}[a-z0-9]$/),
    fc.constantFrom(".com", ".de", ".example"),
  )
  .map(([scheme, host, tld]) => `${scheme}${host}${tld}/contact`);
const detail = fc.oneof(email, phone, url);

describe("maskContactDetails: properties", () => {
  it("leaves technical talk unchanged", () => {
    fc.assert(
      fc.property(technicalText, (text) => {
        expect(masks(text)).toEqual({ text, masked: false, kinds: [] });
      }),
      { seed: 9020, numRuns: 400 },
    );
  });

  it("hides any contact detail put into technical talk, and keeps the talk", () => {
    fc.assert(
      fc.property(technicalText, detail, technicalText, (before, d, after) => {
        const result = masks(`${before}, ${d} ${after}`);
        expect(result.masked).toBe(true);
        expect(result.text).not.toContain(d);
        expect(result.text).toContain(before);
        expect(result.text.endsWith(after)).toBe(true);
      }),
      { seed: 9021, numRuns: 400 },
    );
  });

  it("is settled after one pass: masking masked text changes nothing", () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(figure, detail, fc.string({ maxLength: 12 })), { maxLength: 10 }), (parts) => {
        const once = masks(parts.join(" ")).text;
        expect(masks(once)).toEqual({ text: once, masked: false, kinds: [] });
      }),
      { seed: 9022, numRuns: 400 },
    );
  });
});
