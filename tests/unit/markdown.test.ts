import { describe, expect, it } from "vitest";
import { renderMarkdown } from "~/domain/markdown";

// Rendering checks against the CommonMark specification (spec.commonmark.org, version 0.31.2).
// The inputs and expected HTML below are written from the spec's rules; example numbers are
// not cited because they were not read from the spec's own test data here (memory).
describe("CommonMark rendering", () => {
  const html = (md: string) => renderMarkdown(md).html.trim();

  it("ATX headings of levels 1-3 (spec 4.2)", () => {
    expect(html("# foo\n## foo\n### foo")).toBe('<h1 id="foo">foo</h1>\n<h2 id="foo-1">foo</h2>\n<h3 id="foo-2">foo</h3>');
  });

  it("emphasis and strong emphasis (spec 6.2)", () => {
    expect(html("*foo* **bar**")).toBe("<p><em>foo</em> <strong>bar</strong></p>");
  });

  it("a tight ordered list that starts at 3 (spec 5.3)", () => {
    expect(html("3. one\n4. two")).toBe('<ol start="3">\n<li>one</li>\n<li>two</li>\n</ol>');
  });

  it("a fenced code block keeps its content verbatim and escaped (spec 4.5)", () => {
    expect(html("```\n<a> & b\n```")).toBe("<pre><code>&#x3C;a> &#x26; b\n</code></pre>");
  });

  it("backslash escapes make punctuation literal (spec 2.4)", () => {
    expect(html("\\*not emphasized*")).toBe("<p>*not emphasized*</p>");
  });

  it("GFM tables render with alignment (GitHub Flavored Markdown spec, tables extension)", () => {
    const out = html("| space | in |\n|:--|--:|\n| settee | 24 1/2 |");
    expect(out).toContain("<table>");
    expect(out).toContain('<td align="right">24 1/2</td>');
  });
});

// Sanitiser checks with vectors from the OWASP XSS Filter Evasion Cheat Sheet.
describe("sanitising hostile input (OWASP XSS Filter Evasion Cheat Sheet)", () => {
  const vectors = [
    "<script>alert('XSS')</script>",
    "<IMG SRC=\"javascript:alert('XSS');\">",
    '<IMG SRC=javascript:alert(String.fromCharCode(88,83,83))>',
    "<img src=x onerror=alert(1)>",
    '<svg/onload=alert("XSS")>',
    '<BODY ONLOAD=alert("XSS")>',
    '<iframe src="javascript:alert(\'XSS\');"></iframe>',
    "[click](javascript:alert(1))",
    "[click](JaVaScRiPt:alert(1))",
    "[click](&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;alert(1))",
    '<a href="data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==">x</a>',
    "![x](javascript:alert(1))",
    '<div style="background:url(javascript:alert(1))">x</div>',
  ];
  for (const vector of vectors) {
    it(`neutralises ${vector}`, () => {
      const out = renderMarkdown(vector).html.toLowerCase();
      // No executable element, no event-handler or style attribute, no script or data URL in a link.
      expect(out).not.toMatch(/<(script|iframe|svg|body|img|div)\b/);
      expect(out).not.toMatch(/<[^>]*\s(on\w+|style)=/);
      expect(out).not.toMatch(/(href|src)="\s*(javascript|data):/);
    });
  }

  it("drops raw HTML but keeps the text around it", () => {
    expect(renderMarkdown("before <b>bold</b> after").html).toBe("<p>before bold after</p>");
  });

  it("keeps images from our own store and drops images from anywhere else", () => {
    const out = renderMarkdown("![ours](/media/abc.jpg) ![theirs](https://example.com/x.jpg) ![up](/media/../etc/passwd)").html;
    expect(out).toContain('<img src="/media/abc.jpg" alt="ours">');
    expect(out).not.toContain("example.com");
    expect(out).not.toContain("passwd");
  });

  it("keeps ordinary links", () => {
    expect(renderMarkdown("[safety](/safety)").html).toBe('<p><a href="/safety">safety</a></p>');
  });
});

describe("plain text for search", () => {
  // Search needs the words as written with whitespace between blocks and cells (common practice:
  // PostgreSQL's to_tsvector splits words on whitespace and punctuation, so "metricimperial" would be one word).
  it("keeps words, drops markup, separates blocks and list items", () => {
    const { text } = renderMarkdown("## Fitting the box\n\nCut **plywood** to [size](/x).\n\n- one\n- two");
    expect(text).toBe("Fitting the box\nCut plywood to size.\none\ntwo");
  });

  it("separates table cells by a space and rows by a new line", () => {
    const { text } = renderMarkdown("| metric | imperial |\n|---|---|\n| 610 mm | 24 in |\n\nPort side only.");
    expect(text).toBe("metric imperial\n610 mm 24 in\nPort side only.");
    expect(text).not.toMatch(/metricimperial|imperial610|inPort/);
  });

  it("keeps block quotes, code and nested lists apart, and image alt text", () => {
    const { text } = renderMarkdown("> A quote\n\n```\nfuse 40 A\n```\n\n1. first\n   - inner\n2. second\n\n![the box](/media/x.webp)");
    expect(text.split("\n")).toEqual(["A quote", "fuse 40 A", "first", "inner", "second", "the box"]);
  });

  it("keeps a hard line break as a break and leaves raw HTML out", () => {
    expect(renderMarkdown("one  \ntwo <b>three</b>").text).toBe("one\ntwo three");
  });
});
