import jsQR from "jsqr";

// Reading a PDF as a person or a scanner would: its text through pdf.js (the legacy build runs in
// Node), its images decoded to RGBA, and any QR code among them through jsQR.

async function open(bytes: Uint8Array) {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  // No OffscreenCanvas in Node: images come back as plain pixel arrays.
  return { pdfjs, doc: await pdfjs.getDocument({ data: new Uint8Array(bytes), isOffscreenCanvasSupported: false, verbosity: 0 }).promise };
}

/** Each page's text, its items joined by spaces and runs of whitespace squeezed. */
export async function pdfPages(bytes: Uint8Array): Promise<string[]> {
  const { doc } = await open(bytes);
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    const text = content.items.map((item) => ("str" in item ? item.str + (item.hasEOL ? "\n" : "") : "")).join("");
    pages.push(text.replace(/[ \t]+/g, " "));
  }
  await doc.destroy();
  return pages;
}

/** pdf.js's image object: kind 1 = 1-bit grey, 2 = RGB, 3 = RGBA. */
interface PdfImage {
  width: number;
  height: number;
  kind: number;
  data: Uint8ClampedArray;
}

interface DecodedImage {
  width: number;
  height: number;
  rgba: Uint8ClampedArray;
}

/** Every image drawn on the page, decoded. */
export async function pdfImages(bytes: Uint8Array, pageNumber = 1): Promise<DecodedImage[]> {
  const { pdfjs, doc } = await open(bytes);
  const page = await doc.getPage(pageNumber);
  const ops = await page.getOperatorList();
  const out: DecodedImage[] = [];
  for (let i = 0; i < ops.fnArray.length; i++) {
    if (ops.fnArray[i] !== pdfjs.OPS.paintImageXObject) continue;
    const name = ops.argsArray[i][0] as string;
    // pdf.js's image object: width, height, kind (1 = 1 bit grey, 2 = RGB, 3 = RGBA) and the pixels.
    const img = await new Promise<PdfImage>((resolve) => page.objs.get(name, resolve));
    out.push({ width: img.width, height: img.height, rgba: toRgba(img) });
  }
  await doc.destroy();
  return out;
}

function toRgba(img: PdfImage): Uint8ClampedArray {
  const n = img.width * img.height;
  if (img.kind === 3) return img.data;
  const out = new Uint8ClampedArray(n * 4);
  for (let p = 0; p < n; p++) {
    let v: [number, number, number];
    if (img.kind === 2) v = [img.data[p * 3], img.data[p * 3 + 1], img.data[p * 3 + 2]];
    else {
      const row = Math.floor(p / img.width);
      const col = p % img.width;
      const byte = img.data[row * Math.ceil(img.width / 8) + (col >> 3)];
      const bit = (byte >> (7 - (col & 7))) & 1;
      v = bit ? [255, 255, 255] : [0, 0, 0];
    }
    out.set([...v, 255], p * 4);
  }
  return out;
}

/** The text of the first QR code found among the page's images, or null. */
export async function pdfQrCode(bytes: Uint8Array, pageNumber = 1): Promise<string | null> {
  for (const img of await pdfImages(bytes, pageNumber)) {
    const code = jsQR(img.rgba, img.width, img.height);
    if (code) return code.data;
  }
  return null;
}
