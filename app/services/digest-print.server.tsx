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
    + `<style>${literataFontCss()}\nhtml,body{margin:0;background:#fff}${DIGEST_CSS}</style></head><body>${body}</body></html>`;
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

/**
 * The thumbnails the digest shows, fetched from the photo store as data: URLs (missing ones are
 * skipped). Printed about 1.5 in wide, so they are made 300 px wide (200 dpi) JPEGs, which
 * Chromium embeds in the PDF as they are instead of re-compressing decoded pixels.
 */
export async function loadThumbnails(snapshot: DigestSnapshot, fetchObject = getObject): Promise<Map<string, string>> {
  const keys = [...new Set(snapshot.sections.flatMap((x) => x.entries.map((e) => e.thumbnailKey)).filter((k): k is string => !!k))];
  const photos = new Map<string, string>();
  // A few at a time: a digest of a busy year may show hundreds.
  for (let i = 0; i < keys.length; i += 8) {
    await Promise.all(keys.slice(i, i + 8).map(async (key) => {
      const object = await fetchObject(key).catch(() => null);
      if (!object) return;
      const bytes = await streamToBuffer(object.body);
      const jpeg = await sharp(bytes).resize({ width: 300, withoutEnlargement: true }).flatten({ background: "#ffffff" }).jpeg({ quality: 72 }).toBuffer()
        .catch(() => null);
      if (jpeg) photos.set(key, `data:image/jpeg;base64,${jpeg.toString("base64")}`);
    }));
  }
  return photos;
}

export function digestFooter(className: string, snapshot: DigestSnapshot): string {
  const label = escapeHtml(`${className} owners' association · ${digestTitle(snapshot.year, snapshot.edition)}`);
  return `<div style="width:100%;padding:0 0.75in;font:7.5pt Arial,Helvetica,sans-serif;color:#4d5a61;display:flex;justify-content:space-between">`
    + `<span>${label}</span><span><span class="pageNumber"></span> / <span class="totalPages"></span></span></div>`;
}

/** The PDF of an edition. */
export async function buildDigestPdf(snapshot: DigestSnapshot, options: { className: string; appUrl: string; fetchObject?: typeof getObject }): Promise<Uint8Array> {
  const photos = await loadThumbnails(snapshot, options.fetchObject);
  const html = digestPrintHtml(snapshot, { ...options, photos });
  const entries = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
  return htmlToPdf(html, { footerTemplate: digestFooter(options.className, snapshot), tagged: entries <= DIGEST_LARGE_ENTRIES });
}
