// The rules for text people type, without zod: the market's search box checks its text with them on
// every public page, and text.ts builds the forms' schemas on them. Names (display names, makers,
// models, titles, short labels) are one line, NFC-normalised, with no control characters and no
// bidirectional overrides or isolates, which could make a name read differently from how it is stored.
// Free text (notes, descriptions) may hold tabs and line breaks but no other control characters.
// Neither may hold a lone surrogate half, which PostgreSQL cannot store.

export type TextKind = "name" | "free";

// C0 controls, DEL and C1 controls; free text keeps tab (U+0009) and line feed (U+000A).
const NAME_CONTROL = /[\u0000-\u001f\u007f-\u009f]/u;
const FREE_CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/u;
// LRE, RLE, PDF, LRO, RLO and the isolates LRI, RLI, FSI, PDI.
const BIDI_CONTROL = /[\u202a-\u202e\u2066-\u2069]/u;

// Without the u flag the pattern sees UTF-16 code units, so halves that are not part of a pair show.
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

const codePoint = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;

/** Whether the string holds an unpaired UTF-16 surrogate (invalid Unicode). */
export function hasLoneSurrogate(s: string): boolean {
  return LONE_SURROGATE.test(s);
}

/** Why `value` cannot be stored as this kind of text, in words for the person who typed it; null if it can. */
export function textProblem(value: string, kind: TextKind, label = "This text"): string | null {
  if (hasLoneSurrogate(value)) return `${label} holds a broken character (an unpaired surrogate); type it again.`;
  const control = (kind === "name" ? NAME_CONTROL : FREE_CONTROL).exec(value);
  if (control) {
    const nul = control[0] === "\u0000";
    const what = nul ? "a NUL character (U+0000)" : `an invisible control character (${codePoint(control[0])})`;
    const allowed = kind === "name" ? "it must be one line of visible text" : "only tabs and line breaks are allowed";
    return `${label} contains ${what}; ${allowed}.`;
  }
  if (kind === "name") {
    const bidi = BIDI_CONTROL.exec(value);
    if (bidi) {
      return `${label} contains a hidden text-direction control (${codePoint(bidi[0])}), which can make it read differently from what is stored; remove it.`;
    }
  }
  return null;
}
