// The one Markdown pipeline: what an author writes becomes safe HTML plus plain text for search.
// unified + remark-parse + remark-gfm -> remark-rehype (raw HTML dropped) -> rehype-sanitize -> rehype-slug.
// Checked against the CommonMark Spec 0.31.2 examples: tests/unit/commonmark-spec.test.ts.
import type { Element as HastElement, Root as HastRoot } from "hast";
import type { Nodes as MdastNodes, Root as MdastRoot } from "mdast";
import rehypeSanitize, { defaultSchema, type Options as SanitizeSchema } from "rehype-sanitize";
import rehypeSlug from "rehype-slug";
import rehypeStringify from "rehype-stringify";
import remarkGfm from "remark-gfm";
import remarkParse from "remark-parse";
import remarkRehype from "remark-rehype";
import { unified } from "unified";

/** Images may only come from the product's own photo store. */
export const OWN_MEDIA_PREFIX = "/media/";

const schema: SanitizeSchema = {
  ...defaultSchema,
  // Only our own images; no protocols at all for src (relative paths only, checked below).
  protocols: { ...defaultSchema.protocols, src: [] },
  attributes: {
    ...defaultSchema.attributes,
    img: ["src", "alt", "title"],
  },
};

function keepOwnImagesOnly() {
  return (tree: HastRoot) => {
    const visit = (node: HastRoot | HastElement) => {
      node.children = node.children.filter((child) => {
        if (child.type !== "element") return true;
        if (child.tagName === "img") {
          const src = String(child.properties?.src ?? "");
          return src.startsWith(OWN_MEDIA_PREFIX) && !src.includes("..");
        }
        visit(child);
        return true;
      }) as typeof node.children;
    };
    visit(tree);
  };
}

/**
 * A URL scheme is case-insensitive (RFC 3986, 3.1): "MAILTO:" and "HTTPS:" are the same as
 * "mailto:" and "https:", but the sanitiser compares protocols as written. Lower-case the scheme first.
 */
function lowerCaseUrlSchemes() {
  return (tree: HastRoot) => {
    const visit = (node: HastRoot | HastElement) => {
      for (const child of node.children) {
        if (child.type !== "element") continue;
        for (const key of ["href", "src"] as const) {
          const value = child.properties?.[key];
          if (typeof value === "string") {
            child.properties[key] = value.replace(/^[a-z][a-z0-9+.-]*:/i, (scheme) => scheme.toLowerCase());
          }
        }
        visit(child);
      }
    };
    visit(tree);
  };
}

/**
 * The parsing half of the pipeline: CommonMark with the GFM extensions, turned into an HTML tree
 * with raw HTML dropped (remark-rehype without allowDangerousHtml). Exported so that the CommonMark
 * conformance test runs exactly the parser configuration the product uses.
 */
export function markdownCore() {
  return unified().use(remarkParse).use(remarkGfm).use(remarkRehype);
}

const processor = markdownCore()
  .use(lowerCaseUrlSchemes)
  .use(rehypeSanitize, schema)
  .use(keepOwnImagesOnly)
  .use(rehypeSlug) // after sanitizing: the ids are ours, made from heading text
  .use(rehypeStringify);

export type RenderedMarkdown = { html: string; text: string };

export function renderMarkdown(markdown: string): RenderedMarkdown {
  const mdast = processor.parse(markdown) as MdastRoot;
  const hast = processor.runSync(mdast);
  const html = processor.stringify(hast);
  return { html: String(html), text: plainText(mdast) };
}

/** Inline (phrasing) content: run together as written. Everything else is a block. */
const PHRASING = new Set([
  "text", "emphasis", "strong", "delete", "inlineCode", "link", "linkReference", "image", "imageReference",
  "break", "html", "footnoteReference",
]);

/**
 * Plain text of the body for full-text search: words as written, blocks (paragraphs, headings, list
 * items, table rows, code) on lines of their own, table cells apart by a space. Raw HTML is left
 * out (it is not shown either); images give their alt text.
 */
function plainText(tree: MdastRoot): string {
  const text = (node: MdastNodes): string => {
    switch (node.type) {
      case "text":
      case "inlineCode":
      case "code":
        return node.value;
      case "html":
        return "";
      case "image":
      case "imageReference":
        return node.alt ?? "";
      case "break":
        return "\n";
      case "tableRow":
        return node.children.map(text).map((t) => t.trim()).filter(Boolean).join(" ");
    }
    if (!("children" in node)) return "";
    const children = node.children as MdastNodes[];
    const inline = children.every((c) => PHRASING.has(c.type));
    if (inline) return children.map(text).join("");
    return children.map(text).filter((t) => t.trim() !== "").join("\n");
  };
  return text(tree).replace(/[ \t]+\n/g, "\n").replace(/\n{2,}/g, "\n").trim();
}
