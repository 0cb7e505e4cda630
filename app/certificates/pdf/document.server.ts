import PDFDocument from "pdfkit";
import QRCode from "qrcode";
import type { Outcome } from "@shared/bench";
import type { CertificateData } from "../certificate.server";
import { plotList } from "./charts.server";
import { heightOf, registerFonts, write, type Family } from "./fonts.server";
import { COLOURS } from "./style";

// The bench certificate as a printable A4 PDF: the unit, who listed and measured it, the key figures
// and every reading with its conditions, each check's outcome and source, the plots as vector paths,
// and a QR code to the certificate's page on Loadline, which says whether the sheet is still the one
// certified. Text is real text in embedded fonts, so it can be searched, copied and read aloud.

const PAGE = { w: 595.28, h: 841.89, margin: 48 };
const WIDTH = PAGE.w - 2 * PAGE.margin;
const BOTTOM = PAGE.h - PAGE.margin - 16;
const OUTCOME: Record<Outcome, { word: string; colour: string; wash: string }> = {
  consistent: { word: "Consistent", colour: COLOURS.trace, wash: COLOURS.traceWash },
  questionable: { word: "Questionable", colour: COLOURS.brassInk, wash: COLOURS.brassWash },
  implausible: { word: "Implausible", colour: COLOURS.fault, wash: COLOURS.faultWash },
  missing: { word: "Missing", colour: COLOURS.inkFaint, wash: "#ece5d7" },
};
const dayFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

/** "14 March 2027, 09:12 UTC". */
export function issuedText(at: Date): string {
  return `${dayFormat.format(at)}, ${at.toISOString().slice(11, 16)} UTC`;
}

/** The QR code for the confirm page, as a PNG (embedded as an image, so a reader can also lift it out). */
export function qrPng(url: string): Promise<Buffer> {
  return QRCode.toBuffer(url, {
    type: "png",
    errorCorrectionLevel: "M",
    margin: 4,
    scale: 6,
    color: { dark: "#1f1a15ff", light: "#ffffffff" },
  });
}

export async function certificatePdf(c: CertificateData): Promise<Buffer> {
  const qr = await qrPng(c.confirmUrl);
  const doc = new PDFDocument({
    size: "A4",
    margin: PAGE.margin,
    bufferPages: true,
    info: {
      Title: `Bench certificate: ${c.listing.title}`,
      Author: c.seller.name,
      Subject: `Loadline bench certificate ${c.id}`,
      Creator: "Loadline",
    },
  });
  const chunks: Buffer[] = [];
  doc.on("data", (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  registerFonts(doc);
  const page = new Cursor(doc);
  header(page, c, qr);
  facts(page, c);
  keyFigures(page, c);
  readings(page, c);
  checks(page, c);
  plots(page, c);
  closing(page, c);
  footers(doc, c);
  doc.end();
  return done;
}

/** Where the next block goes, and a new page when it would not fit. */
class Cursor {
  y = PAGE.margin;
  constructor(readonly doc: PDFKit.PDFDocument) {}
  need(height: number) {
    if (this.y + height <= BOTTOM) return;
    this.doc.addPage();
    this.y = PAGE.margin;
  }
  text(s: string, family: Family, size: number, colour: string, x = PAGE.margin, width = WIDTH, gap = 2) {
    this.doc.fontSize(size).fillColor(colour);
    const h = heightOf(this.doc, s, family, width);
    this.need(h);
    write(this.doc, s, family, x, this.y, { width });
    this.y += h + gap;
  }
  heading(s: string) {
    this.need(60);
    this.y += 10;
    this.text(s, "serif", 13, COLOURS.ink, PAGE.margin, WIDTH, 2);
    this.doc
      .lineWidth(0.5)
      .strokeColor(COLOURS.rule)
      .moveTo(PAGE.margin, this.y)
      .lineTo(PAGE.margin + WIDTH, this.y)
      .stroke();
    this.y += 6;
  }
  /** One table row: cells at fixed widths, as tall as its tallest cell. */
  row(cells: { s: string; family?: Family; w: number; colour?: string; size?: number; badge?: Outcome }[]) {
    const doc = this.doc;
    const heights = cells.map((cell) => {
      doc.fontSize(cell.size ?? 8);
      return heightOf(doc, cell.s, cell.family ?? "sans", cell.w - 6);
    });
    const h = Math.max(...heights) + 5;
    this.need(h);
    let x = PAGE.margin;
    for (const cell of cells) {
      if (cell.badge) {
        const o = OUTCOME[cell.badge];
        doc.roundedRect(x, this.y + 0.5, cell.w - 8, 11, 2).fill(o.wash);
        doc.fontSize(7).fillColor(o.colour);
        write(doc, o.word, "sansBold", x + 3, this.y + 2.5, { width: cell.w - 14, lineBreak: false });
      } else {
        doc.fontSize(cell.size ?? 8).fillColor(cell.colour ?? COLOURS.ink);
        write(doc, cell.s, cell.family ?? "sans", x, this.y + 2, { width: cell.w - 6 });
      }
      x += cell.w;
    }
    this.y += h;
    doc
      .lineWidth(0.3)
      .strokeColor(COLOURS.rule)
      .moveTo(PAGE.margin, this.y)
      .lineTo(PAGE.margin + WIDTH, this.y)
      .stroke();
  }
}

function header(p: Cursor, c: CertificateData, qr: Buffer) {
  const doc = p.doc;
  const qrSize = 96;
  const textWidth = WIDTH - qrSize - 16;
  doc.image(qr, PAGE.margin + WIDTH - qrSize, PAGE.margin - 6, { width: qrSize, height: qrSize });
  doc.fontSize(6.5).fillColor(COLOURS.inkFaint);
  write(doc, "Scan to check it against the bench sheet on Loadline", "sans", PAGE.margin + WIDTH - qrSize, PAGE.margin + qrSize - 4, {
    width: qrSize,
    align: "center",
  });
  p.text("LOADLINE · BENCH CERTIFICATE", "sansBold", 8, COLOURS.brassInk, PAGE.margin, textWidth, 6);
  p.text(c.listing.title, "serif", 22, COLOURS.ink, PAGE.margin, textWidth, 2);
  p.text([c.listing.category, c.listing.era].filter(Boolean).join(" · "), "sans", 10, COLOURS.inkSoft, PAGE.margin, textWidth, 8);
  p.text(c.bench.summary, "sans", 9, COLOURS.trace, PAGE.margin, textWidth, 4);
  p.y = Math.max(p.y, PAGE.margin + qrSize + 20);
}

function facts(p: Cursor, c: CertificateData) {
  const seller =
    c.seller.kind === "workshop"
      ? `${c.seller.name}${c.seller.verifiedWorkshop ? " (verified workshop)" : ""}`
      : `${c.seller.name} (private seller)`;
  const counts = c.bench.counts;
  const place: [string, string, Family][] = c.seller.place ? [["Place", c.seller.place, "sans"]] : [];
  const rows: [string, string, Family][] = [
    [c.seller.kind === "workshop" ? "Workshop" : "Listed by", seller, "sans"],
    ...place,
    ["Measured by", c.bench.measuredBy ?? "not stated on the sheet", "sans"],
    ["Measured on", c.bench.measuredOn ?? "not stated on the sheet", "sans"],
    ["Issued", issuedText(c.issuedAt), "sans"],
    ["Certificate", c.id, "mono"],
    ["Check it at", c.confirmUrl, "mono"],
    [
      "The bench's checks",
      `${counts.consistent} consistent, ${counts.questionable} questionable, ${counts.implausible} implausible, ${counts.missing} missing`,
      "sans",
    ],
  ];
  for (const [label, value, family] of rows)
    p.row([
      { s: label, w: 120, colour: COLOURS.inkSoft },
      { s: value, w: WIDTH - 120, family },
    ]);
}

function keyFigures(p: Cursor, c: CertificateData) {
  if (!c.keyFigures.length) return;
  p.heading("Key figures");
  for (const k of c.keyFigures)
    p.row([
      { s: k.label, w: 150 },
      { s: `${k.value} ${k.unit}`.trim(), w: 90, family: "mono" },
      { s: `${k.conditions}${k.fromCapture ? " · from a capture" : ""}`, w: WIDTH - 240, colour: COLOURS.inkSoft, size: 7.5 },
    ]);
}

function readings(p: Cursor, c: CertificateData) {
  p.heading("Every reading on the bench sheet");
  for (const r of c.bench.readings)
    p.row([
      { s: r.channel ? `${r.quantity} (${r.channel})` : r.quantity, w: 150 },
      { s: r.value, w: 90, family: "mono" },
      {
        s: [
          r.conditions || "conditions not given",
          r.basis === "rated" ? "rated" : "measured",
          r.captureNote ? `from a capture: ${r.captureNote}` : null,
        ]
          .filter(Boolean)
          .join(" · "),
        w: WIDTH - 240,
        colour: COLOURS.inkSoft,
        size: 7.5,
      },
    ]);
}

function checks(p: Cursor, c: CertificateData) {
  p.heading("The bench's checks");
  for (const check of c.bench.checks)
    p.row([
      { s: "", w: 78, badge: check.outcome },
      { s: check.title, w: 170 },
      {
        s: [check.findings.map((f) => f.detail).join(" "), `Source: ${check.source}`].join(" "),
        w: WIDTH - 248,
        colour: COLOURS.inkSoft,
        size: 7,
      },
    ]);
  for (const s of c.bench.skipped)
    p.row([
      { s: "Not checked", w: 78, colour: COLOURS.inkFaint, size: 7 },
      { s: s.title, w: 170 },
      { s: s.reason, w: WIDTH - 248, colour: COLOURS.inkSoft, size: 7 },
    ]);
}

function plots(p: Cursor, c: CertificateData) {
  const list = plotList(c.plots);
  if (!list.length) return;
  p.heading("Plots");
  for (const plot of list) {
    const doc = p.doc;
    doc.fontSize(7.5);
    const captionH = heightOf(doc, plot.conditions, "sans", WIDTH);
    p.need(14 + captionH + 170);
    p.text(plot.title, "sansBold", 9.5, COLOURS.ink, PAGE.margin, WIDTH, 1);
    p.text(plot.conditions, "sans", 7.5, COLOURS.inkSoft, PAGE.margin, WIDTH, 4);
    plot.draw(doc, { x: PAGE.margin, y: p.y, w: WIDTH, h: 160 });
    p.y += 172;
  }
}

function closing(p: Cursor, c: CertificateData) {
  p.y += 8;
  p.text(
    `This certificate records the unit's bench sheet as it stood when it was issued, ${issuedText(c.issuedAt)}. ` +
      "The bench sheet can change after that; the certificate's page on Loadline (the QR code above) says whether it still matches, " +
      "or since when it has been superseded. The checks compare the figures with each other and with published standards; " +
      "they do not replace listening to the unit or a measurement of your own.",
    "sans",
    7.5,
    COLOURS.inkFaint,
  );
}

function footers(doc: PDFKit.PDFDocument, c: CertificateData) {
  const { start, count } = doc.bufferedPageRange();
  for (let i = start; i < start + count; i++) {
    doc.switchToPage(i);
    doc.fontSize(6.5).fillColor(COLOURS.inkFaint);
    // Inside the bottom margin: pdfkit would open a new page for text past it unless the margin is lifted.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    write(doc, `Loadline bench certificate ${c.id} · page ${i - start + 1} of ${count}`, "sans", PAGE.margin, PAGE.h - PAGE.margin + 14, {
      width: WIDTH,
      align: "center",
      lineBreak: false,
    });
    doc.page.margins.bottom = bottom;
  }
}
