// The digest as a stand-alone HTML document for Chromium to print (app/services/pdf.server.ts):
// the same component and style sheet as the web page, with Literata and the thumbnails inlined as
// data: URLs so that printing needs no network.
import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import { renderToStaticMarkup } from "react-dom/server";
import sharp from "sharp";
import { DigestDocument } from "~/components/digest-document";
import { DIGEST_CSS } from "~/components/digest-style";
import { DIGEST_LARGE_ENTRIES, digestTitle, type DigestSnapshot } from "~/domain/digest";
import { escapeHtml } from "~/domain/digest-email";
import { htmlToPdf } from "./pdf.server";
import { getObject } from "./storage.server";

const FACES = [
  { weight: 400, style: "normal", file: "literata-latin-400-normal.woff2" },
  { weight: 400, style: "italic", file: "literata-latin-400-italic.woff2" },
  { weight: 600, style: "normal", file: "literata-latin-600-normal.woff2" },
  { weight: 700, style: "normal", file: "literata-latin-700-normal.woff2" },
];

let fontCss: string | null = null;

/** @font-face rules for Literata (the files @fontsource/literata ships), as data: URLs. */
export function literataFontCss(): string {
  if (fontCss) return fontCss;
  const require = createRequire(import.meta.url);
  const dir = path.join(path.dirname(require.resolve("@fontsource/literata/package.json")), "files");
  fontCss = FACES.map((f) => {
    const data = fs.readFileSync(path.join(dir, f.file)).toString("base64");
    return `@font-face{font-family:"Literata";font-style:${f.style};font-weight:${f.weight};font-display:block;src:url(data:font/woff2;base64,${data}) format("woff2");}`;
  }).join("\n");
  return fontCss;
}

/** The whole printable document. `photos` maps a thumbnail key to a data: URL. */
export function digestPrintHtml(snapshot: DigestSnapshot, options: { className: string; appUrl: string; photos?: Map<string, string>; draft?: boolean }): string {
  const body = renderToStaticMarkup(
    <DigestDocument
      snapshot={snapshot}
      className={options.className}
      appUrl={options.appUrl}
      photoSrc={(key) => options.photos?.get(key) ?? null}
      draft={options.draft}
    />,
  );
  const title = `${options.className} ${digestTitle(snapshot.year, snapshot.edition).toLowerCase()}`;
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title>`
    + `<style>${literataFontCss()}\nhtml,body{margin:0;background:#fff}${DIGEST_CSS}\n${digestFooterCss(options.className, snapshot)}</style></head><body>${body}</body></html>`;
}

async function streamToBuffer(stream: ReadableStream<Uint8Array>): Promise<Buffer> {
  const chunks: Uint8Array[] = [];
  const reader = stream.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/** Pixels per inch a thumbnail is made for: sharp on paper (150-200 dpi is the usual print resolution), no more. */
export const THUMBNAIL_PPI = 200;

/**
 * The thumbnails the digest shows, fetched from the photo store as data: URLs (missing ones are
 * skipped). They are made at the size they print (`printWidthIn`, THUMBNAIL_PPI), as JPEGs, which
 * Chromium embeds in the PDF as they are instead of re-compressing decoded pixels.
 */
export async function loadThumbnails(snapshot: DigestSnapshot, fetchObject = getObject, printWidthIn = thumbnailPrintWidthIn(snapshot)): Promise<Map<string, string>> {
  const keys = [...new Set(snapshot.sections.flatMap((x) => x.entries.map((e) => e.thumbnailKey)).filter((k): k is string => !!k))];
  const photos = new Map<string, string>();
  const width = Math.ceil(printWidthIn * THUMBNAIL_PPI);
  // A few at a time: a digest of a busy year may show hundreds.
  for (let i = 0; i < keys.length; i += 8) {
    await Promise.all(keys.slice(i, i + 8).map(async (key) => {
      const object = await fetchObject(key).catch(() => null);
      if (!object) return;
      const bytes = await streamToBuffer(object.body);
      const jpeg = await sharp(bytes).resize({ width, withoutEnlargement: true }).flatten({ background: "#ffffff" }).jpeg({ quality: 80 }).toBuffer()
        .catch(() => null);
      if (jpeg) photos.set(key, `data:image/jpeg;base64,${jpeg.toString("base64")}`);
    }));
  }
  return photos;
}

/**
 * How wide a thumbnail prints, in inches: .dg-thumb is 9rem (1.5 in), 5.5rem (0.92 in) in a
 * large year's denser print (components/digest-style.ts; 1rem is 16 CSS px, 96 px to the inch).
 */
export function thumbnailPrintWidthIn(snapshot: DigestSnapshot): number {
  const entries = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
  return (entries > DIGEST_LARGE_ENTRIES ? 5.5 : 9) * 16 / 96;
}

/** A CSS string literal (for `content:`). */
function cssString(text: string): string {
  return `"${text.replace(/[\\"]/g, "\\$&").replace(/[\n\r\f]/g, " ").replace(/</g, "\\3c ")}"`;
}

/**
 * The foot of every printed page: the digest's name on the left, "page / pages" on the right, as
 * CSS page-margin boxes. (Chromium lays these out with the document itself; its
 * displayHeaderFooter template is a small document of its own for every page, about a second of
 * a 350-page year.)
 */
export function digestFooterCss(className: string, snapshot: DigestSnapshot): string {
  const label = `${className} owners' association · ${digestTitle(snapshot.year, snapshot.edition)}`;
  const box = "font:7.5pt Arial,Helvetica,sans-serif;color:#4d5a61;font-variant-numeric:normal;vertical-align:bottom;padding-bottom:0.2in";
  return `@page{@bottom-left{content:${cssString(label)};${box};text-align:left}`
    + `@bottom-right{content:counter(page) " / " counter(pages);${box};text-align:right}}`;
}

/** The PDF of an edition. */
export async function buildDigestPdf(snapshot: DigestSnapshot, options: { className: string; appUrl: string; fetchObject?: typeof getObject }): Promise<Uint8Array> {
  const photos = await loadThumbnails(snapshot, options.fetchObject);
  const html = digestPrintHtml(snapshot, { ...options, photos });
  // Tagged whatever its size: the PDF members keep must be readable with a screen reader too.
  return htmlToPdf(html, { tagged: true });
}
