// The write-up page's rendered bodies are kept in memory: the same Markdown gives the very same
// rendering as the pipeline, and a changed text is rendered anew, never served from the old one.
import { describe, expect, it } from "vitest";
import { renderMarkdown } from "~/domain/markdown";
import { renderMarkdownCached, renderedMarkdownCacheSize } from "~/services/rendered-markdown.server";

describe("rendered write-up bodies kept in memory", () => {
  it("answers the same as the pipeline, and a changed text gets its own rendering", () => {
    const first = "## Battery box\n\nA *group 27* box under the settee.\n\n| metric | imperial |\n|---|---|\n| 343 mm | 13 1/2 in |";
    const once = renderMarkdownCached(first);
    expect(once).toEqual(renderMarkdown(first));
    expect(renderMarkdownCached(first)).toBe(once); // the same object: taken from memory
    const changed = first.replace("group 27", "group 31");
    const again = renderMarkdownCached(changed);
    expect(again.html).toContain("group 31");
    expect(again.html).not.toContain("group 27");
    expect(renderMarkdownCached(first).html).toContain("group 27");
  });

  it("keeps at most 500 renderings, dropping the least recently used", () => {
    const kept = renderMarkdownCached("the first text, read again and again");
    const zero = renderMarkdownCached("text number 0");
    for (let i = 1; i < 600; i++) {
      renderMarkdownCached(`text number ${i}`);
      if (i % 100 === 0) renderMarkdownCached("the first text, read again and again");
    }
    expect(renderedMarkdownCacheSize()).toBe(500);
    expect(renderMarkdownCached("the first text, read again and again")).toBe(kept);
    // "text number 0" was not read again: it went, and comes back as a fresh, equal rendering.
    const zeroAgain = renderMarkdownCached("text number 0");
    expect(zeroAgain).not.toBe(zero);
    expect(zeroAgain).toEqual(zero);
  });
});
