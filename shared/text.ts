import { z } from "zod";

// Text people type, checked the same way in the browser and on the server. Names (display names,
// makers, models, titles, short labels) are one line, NFC-normalised, with no control characters and
// no bidirectional overrides or isolates, which could make a name read differently from how it is
// stored. Free text (notes, descriptions) may hold tabs and line breaks but no other control
// characters. Neither may hold a lone surrogate half, which PostgreSQL cannot store.

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

function refuse(kind: TextKind, label: string) {
  return (value: string, ctx: z.RefinementCtx) => {
    const problem = textProblem(value, kind, label);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  };
}

/**
 * A name, maker, model, title or other one-line label: NFC-normalised and trimmed; control
 * characters and direction overrides are refused. Chain `.min()` / `.max()` for the field's bounds.
 */
export function nameText(label: string) {
  return z.string().normalize("NFC").trim().superRefine(refuse("name", label));
}

/** Notes and descriptions: line breaks as \n; control characters other than tab and newline are refused. */
export function freeText(label: string) {
  return z
    .string()
    .overwrite((s) => s.replace(/\r\n?/g, "\n"))
    .superRefine(refuse("free", label));
}
