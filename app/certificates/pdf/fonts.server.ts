import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";

// The site's own type, embedded: Inter for text, Source Serif 4 for headings, JetBrains Mono for
// figures, from the @fontsource packages the site ships (their WOFF files; fontkit, under pdfkit, reads
// WOFF as it reads TrueType and embeds a TrueType subset). Each family comes in subsets, split by the
// same unicode ranges app/fonts.css gives the browser: Latin has "µ" (micro sign), "−" and "±", Greek
// has "Ω". A text is cut into runs by the subset each character falls in. The fractions and arrows no
// subset has ("⅓") are spelled out.

const require = createRequire(import.meta.url);
const PACKAGES = { inter: "@fontsource/inter", serif: "@fontsource/source-serif-4", mono: "@fontsource/jetbrains-mono" } as const;
const FILE_PREFIX = { inter: "inter", serif: "source-serif-4", mono: "jetbrains-mono" } as const;

export type Family = "sans" | "sansBold" | "serif" | "mono";
const FACES: Record<Family, { pkg: keyof typeof PACKAGES; weight: number }> = {
  sans: { pkg: "inter", weight: 400 },
  sansBold: { pkg: "inter", weight: 600 },
  serif: { pkg: "serif", weight: 600 },
  mono: { pkg: "mono", weight: 400 },
};
const SUBSETS = ["latin", "latin-ext", "greek"] as const;
type Subset = (typeof SUBSETS)[number];

// app/fonts.css's unicode-range per subset, as [first, last] code points; anything else falls to Latin.
const RANGES: Record<Exclude<Subset, "latin">, [number, number][]> = {
  greek: [[0x0370, 0x03ff]],
  "latin-ext": [
    [0x0100, 0x02ba],
    [0x1e00, 0x1eff],
    [0x20a0, 0x20c0],
    [0x2c60, 0x2c7f],
    [0xa720, 0xa7ff],
  ],
};

function subsetOf(cp: number): Subset {
  for (const subset of ["greek", "latin-ext"] as const) if (RANGES[subset].some(([a, b]) => cp >= a && cp <= b)) return subset;
  return "latin";
}

let faces: Map<string, Buffer> | null = null;

function fontFile(pkg: keyof typeof PACKAGES, subset: string, weight: number): Buffer {
  // The packages export only their CSS; their folder is found through it.
  const dir = dirname(require.resolve(PACKAGES[pkg]));
  return readFileSync(join(dir, "files", `${FILE_PREFIX[pkg]}-${subset}-${weight}-normal.woff`));
}

function loadFaces(): Map<string, Buffer> {
  if (faces) return faces;
  const out = new Map<string, Buffer>();
  for (const [family, { pkg, weight }] of Object.entries(FACES)) {
    for (const subset of SUBSETS) out.set(`${family}-${subset}`, fontFile(pkg, subset, weight));
  }
  faces = out;
  return out;
}

/** Registers every face with the document. */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  for (const [name, bytes] of loadFaces()) doc.registerFont(name, bytes);
}

// Characters the bench's texts use that none of the subsets has (checked against the WOFF files' cmaps).
const SPELLED: Record<string, string> = {
  "⅓": " 1/3",
  "⅔": " 2/3",
  "√": "sqrt",
  "→": "->",
  "≈": "~",
  "≥": ">=",
  "≤": "<=",
  "∞": "infinity",
  "⁻": "^-",
  "₋": "-",
  "₀": "0",
  "₃": "3",
};

/** The text cut into runs, each with the face that has its characters (the Latin one where none does). */
export function runsOf(text: string, family: Family): { font: string; text: string }[] {
  const spelled = [...text].map((c) => SPELLED[c] ?? c).join("");
  const out: { font: string; text: string }[] = [];
  for (const ch of spelled) {
    // Digits and spaces are Latin only: "8 Ω at 1 kHz" is three runs.
    const font = `${family}-${subsetOf(ch.codePointAt(0)!)}`;
    if (out.length && out[out.length - 1].font === font) out[out.length - 1].text += ch;
    else out.push({ font, text: ch });
  }
  return out;
}

export type TextOptions = PDFKit.Mixins.TextOptions;

// JetBrains Mono draws "->", "//" and "==" as ligatures whose glyphs the Latin subset leaves out (fontkit
// then reads past the glyph table): figures, ids and addresses are set letter by letter. The object
// form (feature: off) is fontkit's; pdfkit passes it through, though its types know only the list form.
const NO_LIGATURES = { liga: false, calt: false, dlig: false } as unknown as PDFKit.Mixins.OpenTypeFeatures[];
const featuresFor = (family: Family): Pick<TextOptions, "features"> => (family === "mono" ? { features: NO_LIGATURES } : {});

/** Writes text in `family`, switching faces mid-line where a character needs another subset. */
export function write(
  doc: PDFKit.PDFDocument,
  text: string,
  family: Family,
  x: number | undefined,
  y: number | undefined,
  options: TextOptions = {},
): void {
  const runs = runsOf(text, family);
  if (runs.length === 0) return;
  runs.forEach((run, i) => {
    doc.font(run.font);
    const last = i === runs.length - 1;
    if (i === 0) doc.text(run.text, x, y, { ...options, ...featuresFor(family), continued: !last });
    else doc.text(run.text, { ...options, ...featuresFor(family), continued: !last });
  });
}

/** The height `text` takes at `width` in `family` at the current size (measured in its Latin face). */
export function heightOf(doc: PDFKit.PDFDocument, text: string, family: Family, width: number, options: TextOptions = {}): number {
  doc.font(`${family}-latin`);
  return doc.heightOfString([...text].map((c) => SPELLED[c] ?? c).join(""), { ...options, ...featuresFor(family), width });
}
