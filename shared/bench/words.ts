// Category and requirement names inside a sentence: lower case except the trade's abbreviations
// ("THD or THD+N", "RIAA curve"), with the right indefinite article ("an integrated amplifier").
import { CATEGORY_LABELS, type Category } from "./quantities";

/** Words kept as written: abbreviations and names the trade spells in capitals. */
const KEEP = /^(THD\+N|THD|SNR|RIAA|IEC|DIN|AES\d*|IMD|SMPTE|WRMS|DC|AC|dB\w*|[A-Z]{2,}[\w+]*)$/;

/** "Response sweep against the RIAA curve" → "response sweep against the RIAA curve"; "THD or THD+N" stays. */
export function lowerLabel(label: string): string {
  return label
    .split(/(\s+)/)
    .map((w) => {
      const bare = w.replace(/^[(]+|[),.;:]+$/g, "");
      return KEEP.test(bare) ? w : w.toLowerCase();
    })
    .join("");
}

/** "Receiver (amplifier section)" → "receiver (amplifier section)". */
export function categoryNoun(category: Category): string {
  return lowerLabel(CATEGORY_LABELS[category]);
}

/** Numbers read aloud from a vowel: 8, 80–89, 800…, 11 and 18 (and their thousands: "eleven thousand"). */
const VOWEL_NUMBER = /^(8|1[18](?![\d,])|1[18][\d,]{3}(?![\d]))/;

/** "a" or "an" by the sound of the next word: vowels take "an"; so do abbreviations read letter by letter from a vowel sound (an RIAA, an SNR) and numbers said from one (an 8 Ω load). */
export function withArticle(phrase: string): string {
  const first = phrase.trim().split(/\s+/)[0] ?? "";
  const spelled = /^[A-Z]{2,}/.test(first);
  const an = /^\d/.test(first)
    ? VOWEL_NUMBER.test(first)
    : spelled
      ? /^[AEFHILMNORSX]/.test(first)
      : /^[aeiou]/i.test(first) && !/^(one|uni|use|eu)/i.test(first);
  return `${an ? "an" : "a"} ${phrase}`;
}
