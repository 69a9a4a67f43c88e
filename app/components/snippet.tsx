import { snippetParts, type Snippet } from "~/domain/search";

/**
 * A search result's snippet as text: the words found in <mark> elements, the rest plain. Every
 * part is a React text child, so nothing a document contains is ever read as HTML.
 */
export function SnippetText({ snippet }: { snippet: Snippet }) {
  return (
    <p className="mt-2 font-serif leading-relaxed" data-snippet="">
      {snippetParts(snippet).map((p, i) =>
        p.hit ? <mark key={i} className="rounded-sm bg-varnish-400/30 px-0.5 text-ink">{p.text}</mark> : <span key={i}>{p.text}</span>,
      )}
    </p>
  );
}
