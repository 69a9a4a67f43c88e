// Rendered write-up bodies, kept in memory: the Markdown pipeline costs tens of milliseconds for
// a long write-up, and a published text changes only when a new revision is published. Keyed by
// a hash of the Markdown itself, so an edit can never be served from an older rendering.
import { createHash } from "node:crypto";
import { renderMarkdown, type RenderedMarkdown } from "~/domain/markdown";

const MAX_ENTRIES = 500;
const cache = new Map<string, RenderedMarkdown>();

export function renderMarkdownCached(markdown: string): RenderedMarkdown {
  const key = createHash("sha256").update(markdown).digest("base64url");
  const hit = cache.get(key);
  if (hit) {
    // Most recently used last: the oldest entry is the first to go.
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const rendered = renderMarkdown(markdown);
  cache.set(key, rendered);
  if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value as string);
  return rendered;
}

/** How many renderings are kept (for tests). */
export function renderedMarkdownCacheSize(): number {
  return cache.size;
}
