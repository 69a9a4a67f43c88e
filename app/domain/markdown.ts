// The one Markdown pipeline: what an author writes becomes safe HTML plus plain text for search.
// unified + remark-parse + remark-gfm -> remark-rehype (raw HTML dropped) -> rehype-sanitize -> rehype-slug.
import type { Root as MdastRoot } from "mdast";
import { toString } from "mdast-util-to-string";
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
  return (tree: import("hast").Root) => {
    const visit = (node: import("hast").Root | import("hast").Element) => {
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

const processor = unified()
  .use(remarkParse)
  .use(remarkGfm)
  .use(remarkRehype) // without allowDangerousHtml: raw HTML in the source is dropped
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

/** Plain text of the body, paragraphs separated by newlines, for full-text search. */
function plainText(tree: MdastRoot): string {
  return tree.children
    .map((node) => toString(node, { includeImageAlt: true }))
    .filter(Boolean)
    .join("\n");
}
