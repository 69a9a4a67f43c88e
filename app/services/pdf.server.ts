// HTML to PDF with Chromium's print to PDF (playwright-core driving Debian's Chromium, the same
// binary and flags as tests/support/browser.ts). One browser per process, started on first use and
// closed after a minute without work. The page gets no scripts and no network: everything it
// shows (style, fonts, images) must be inside the HTML.
import { type Browser, chromium } from "playwright-core";
import { z } from "zod";

const config = z.object({
  CHROMIUM_PATH: z.string().min(1).default("/usr/bin/chromium"),
}).parse(process.env);

export const CHROMIUM_ARGS = [
  "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
  "--disable-background-networking", "--disable-component-update", "--disable-sync",
];

const IDLE_CLOSE_MS = 60_000;

let browser: Promise<Browser> | null = null;
let idleTimer: NodeJS.Timeout | null = null;
let busy = 0;

function getBrowser(): Promise<Browser> {
  if (!browser) {
    browser = chromium.launch({ executablePath: config.CHROMIUM_PATH, args: CHROMIUM_ARGS });
    browser.then((b) => b.on("disconnected", () => { browser = null; }), () => { browser = null; });
  }
  return browser;
}

function closeWhenIdle() {
  if (idleTimer) clearTimeout(idleTimer);
  idleTimer = setTimeout(() => {
    if (busy > 0 || !browser) return;
    const b = browser;
    browser = null;
    void b.then((x) => x.close()).catch(() => undefined);
  }, IDLE_CLOSE_MS);
  idleTimer.unref();
}

export type PdfOptions = {
  /**
   * Small print at the foot of every page; Chromium fills <span class="pageNumber"> and "totalPages".
   * Chromium lays this template out as a document of its own for every page (about 1 s of CPU for
   * 350 pages): a long document does better with CSS page-margin boxes in its own style sheet
   * (`@page { @bottom-right { content: counter(page) " / " counter(pages) } }`).
   */
  footerTemplate?: string;
  /** A tagged (accessible) PDF, with its structure for screen readers. Default true. */
  tagged?: boolean;
};

/** Prints an HTML document to PDF bytes (page size and margins from its @page rule). */
export async function htmlToPdf(html: string, options: PdfOptions = {}): Promise<Uint8Array> {
  busy++;
  try {
    const b = await getBrowser();
    const context = await b.newContext({ javaScriptEnabled: false, offline: true });
    try {
      const page = await context.newPage();
      // Laid out for print from the start, so Chromium does not lay the document out twice.
      await page.emulateMedia({ media: "print" });
      // Nothing is fetched: data: URLs only (they never reach the router).
      await page.route("**/*", (route) => route.abort());
      await page.setContent(html, { waitUntil: "load", timeout: 60_000 });
      await page.evaluate(() => document.fonts.ready).catch(() => undefined);
      const pdf = await page.pdf({
        preferCSSPageSize: true,
        printBackground: true,
        displayHeaderFooter: Boolean(options.footerTemplate),
        headerTemplate: "<span></span>",
        footerTemplate: options.footerTemplate ?? "<span></span>",
        outline: true,
        tagged: options.tagged ?? true,
      });
      return new Uint8Array(pdf);
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    busy--;
    closeWhenIdle();
  }
}

/** Closes the browser now (benchmarks and tests). */
export async function closePdfBrowser(): Promise<void> {
  if (idleTimer) clearTimeout(idleTimer);
  const b = browser;
  browser = null;
  if (b) await b.then((x) => x.close()).catch(() => undefined);
}
