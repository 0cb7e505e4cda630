import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type { Browser } from "playwright-core";

// A PDF's pages as a person sees them: pdf.js draws each page on a canvas in Chromium (headless
// Chromium has no PDF viewer of its own), and the canvas is photographed. Everything is served from a
// made-up origin through request routing, so nothing touches the app's Content-Security-Policy.

const require = createRequire(import.meta.url);
const BUILD = path.dirname(require.resolve("pdfjs-dist/build/pdf.min.mjs"));
const ORIGIN = "http://pdf-render.invalid";

const PAGE = `<!doctype html><html><body style="margin:0;background:#888">
<script type="module">
import * as pdfjs from "${ORIGIN}/pdf.min.mjs";
pdfjs.GlobalWorkerOptions.workerSrc = "${ORIGIN}/pdf.worker.min.mjs";
const bytes = new Uint8Array(await (await fetch("${ORIGIN}/file.pdf")).arrayBuffer());
const doc = await pdfjs.getDocument({ data: bytes }).promise;
for (let i = 1; i <= doc.numPages; i++) {
  const page = await doc.getPage(i);
  const viewport = page.getViewport({ scale: window.RENDER_SCALE ?? 1.5 });
  const canvas = document.createElement("canvas");
  canvas.width = viewport.width; canvas.height = viewport.height; canvas.id = "page-" + i;
  canvas.style.display = "block"; canvas.style.marginBottom = "8px";
  document.body.append(canvas);
  await page.render({ canvasContext: canvas.getContext("2d"), viewport }).promise;
}
document.body.dataset.pages = String(doc.numPages);
</script></body></html>`;

/** PNG pictures of the PDF's pages at `scale` × 72 dpi. */
export async function renderPdfPages(browser: Browser, pdf: Uint8Array, scale = 1.5): Promise<Buffer[]> {
  const context = await browser.newContext({ viewport: { width: 1000, height: 1400 } });
  try {
    await context.route(`${ORIGIN}/**`, async (route) => {
      const name = new URL(route.request().url()).pathname.slice(1);
      if (name === "") return route.fulfill({ contentType: "text/html", body: PAGE });
      if (name === "file.pdf") return route.fulfill({ contentType: "application/pdf", body: Buffer.from(pdf) });
      if (name === "pdf.min.mjs" || name === "pdf.worker.min.mjs")
        return route.fulfill({ contentType: "text/javascript", body: fs.readFileSync(path.join(BUILD, name)) });
      return route.fulfill({ status: 404, body: "" });
    });
    const page = await context.newPage();
    await page.addInitScript((s) => Object.assign(window, { RENDER_SCALE: s }), scale);
    await page.goto(`${ORIGIN}/`);
    await page.waitForSelector("body[data-pages]", { timeout: 30_000 });
    const count = Number(await page.locator("body").getAttribute("data-pages"));
    const shots: Buffer[] = [];
    for (let i = 1; i <= count; i++) shots.push(await page.locator(`#page-${i}`).screenshot());
    return shots;
  } finally {
    await context.close();
  }
}
