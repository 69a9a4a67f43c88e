// The digest's own style sheet, for the web page (a <style> in the page) and for the PDF (inlined in
// the document Chromium prints). Colours and type from docs/visual-identity.md; everything is
// scoped under .dg so the rest of the app is untouched. Print rules: US Letter, page breaks that
// keep an entry and its heading together, no navigation chrome (app.css hides .no-print).

export const DIGEST_CSS = String.raw`
.dg {
  --dg-deep-50: #eef5f7; --dg-deep-100: #d5e6eb; --dg-deep-200: #a9ccd6; --dg-deep-500: #2f6f82;
  --dg-deep-700: #1d4a58; --dg-deep-900: #0f2a33;
  --dg-cloth-50: #fdfbf6; --dg-cloth-100: #f7f2e6; --dg-cloth-200: #ece3cc; --dg-cloth-300: #dccfae;
  --dg-varnish-500: #c07a2c; --dg-varnish-600: #9c5f1d;
  --dg-boot-50: #fbefec; --dg-boot-600: #a8372a; --dg-boot-800: #6f2219;
  --dg-ink: #1f2529; --dg-ink-soft: #4d5a61;
  --dg-serif: "Literata", Georgia, "Times New Roman", serif;
  --dg-sans: ui-sans-serif, system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif;
  color: var(--dg-ink);
  font-family: var(--dg-serif);
  font-size: 1.0625rem;
  line-height: 1.55;
  font-variant-numeric: oldstyle-nums proportional-nums;
}
.dg * { box-sizing: border-box; }
/* Zero specificity, so the classes below set their own margins. */
:where(.dg) :where(h1, h2, h3) { font-family: var(--dg-serif); color: var(--dg-deep-900); margin: 0; }
:where(.dg) :where(p) { margin: 0; }
.dg a { color: var(--dg-deep-700); }
.dg-sans { font-family: var(--dg-sans); }
.dg-kicker {
  font-family: var(--dg-sans); font-size: 0.78rem; font-weight: 600; letter-spacing: 0.14em;
  text-transform: uppercase; color: var(--dg-deep-500);
}
.dg-draft-mark {
  font-family: var(--dg-sans); font-size: 0.85rem; font-weight: 600; color: var(--dg-boot-800);
  background: var(--dg-boot-50); border-left: 4px solid var(--dg-boot-600); padding: 0.5rem 0.75rem; margin-bottom: 1.5rem;
}

/* Cover */
.dg-cover { padding-bottom: 2rem; display: flex; flex-direction: column; }
.dg-cover-band { border-top: 6px solid var(--dg-deep-900); border-bottom: 1px solid var(--dg-deep-200); padding: 0.9rem 0 0.7rem; }
.dg-cover-title { margin-top: 2.2rem; display: grid; gap: 0.25rem; }
.dg-cover-title .dg-year {
  font-size: 5.5rem; line-height: 0.95; font-weight: 700; color: var(--dg-deep-900);
  font-variant-numeric: lining-nums; letter-spacing: -0.02em;
}
.dg-cover-title .dg-title { font-size: 2.1rem; line-height: 1.15; font-weight: 600; color: var(--dg-deep-700); }
.dg-cover-sub { margin-top: 1.2rem; font-family: var(--dg-sans); font-size: 0.92rem; color: var(--dg-ink-soft); }
.dg-correction {
  margin-top: 1.4rem; padding: 0.7rem 0.9rem; border-left: 4px solid var(--dg-boot-600); background: var(--dg-boot-50);
  color: var(--dg-boot-800); font-family: var(--dg-sans); font-size: 0.92rem;
}
.dg-stats {
  margin-top: 2rem; display: grid; grid-template-columns: repeat(4, minmax(0, 1fr)); gap: 0;
  border-top: 1px solid var(--dg-deep-200); border-bottom: 1px solid var(--dg-deep-200);
}
.dg-stat { padding: 0.8rem 0.6rem 0.9rem; border-left: 1px solid var(--dg-cloth-300); }
.dg-stat:first-child { border-left: 0; padding-left: 0; }
.dg-stat-value { display: block; font-size: 2.3rem; line-height: 1.05; font-weight: 600; color: var(--dg-deep-900); font-variant-numeric: lining-nums; }
.dg-stat-label { display: block; margin-top: 0.2rem; font-family: var(--dg-sans); font-size: 0.8rem; color: var(--dg-ink-soft); line-height: 1.35; }
.dg-contents { margin-top: 2rem; }
.dg-contents h2 { font-size: 1.1rem; font-weight: 600; }
.dg-contents ol { list-style: none; margin: 0.6rem 0 0; padding: 0; columns: 2; column-gap: 2rem; }
.dg-contents li.dg-toc-section { break-inside: avoid; margin-bottom: 0.7rem; }
.dg-toc-name { font-family: var(--dg-sans); font-size: 0.72rem; font-weight: 700; letter-spacing: 0.12em; text-transform: uppercase; color: var(--dg-deep-500); }
.dg-contents ul { list-style: none; margin: 0.15rem 0 0; padding: 0; }
.dg-contents ul li { font-size: 0.9rem; line-height: 1.35; margin: 0.2rem 0; }
.dg-contents ul li span { display: block; font-family: var(--dg-sans); font-size: 0.74rem; color: var(--dg-ink-soft); }

/* Letter and figures */
.dg-letter { margin-top: 2.5rem; }
.dg-letter h2, .dg-figures h2, .dg-section-head h2, .dg-safety h2 { font-size: 1.66rem; font-weight: 600; }
.dg-letter-body { margin-top: 0.8rem; max-width: 38rem; }
.dg-letter-body p { margin: 0 0 0.8rem; }
.dg-letter-body h1, .dg-letter-body h2, .dg-letter-body h3 { font-size: 1.15rem; margin: 1rem 0 0.4rem; }
.dg-letter-body ul, .dg-letter-body ol { margin: 0 0 0.8rem; padding-left: 1.3rem; }
.dg-letter-body blockquote { margin: 0 0 0.8rem; padding-left: 0.9rem; border-left: 3px solid var(--dg-cloth-300); font-style: italic; }
.dg-figures { margin-top: 2.5rem; }
.dg-figures-grid { margin-top: 1rem; display: grid; grid-template-columns: minmax(0, 3fr) minmax(0, 2fr); gap: 2rem; align-items: start; }
.dg-figures h3 { font-family: var(--dg-sans); font-size: 0.85rem; font-weight: 600; color: var(--dg-ink); margin-bottom: 0.4rem; }
.dg-chart { width: 100%; height: auto; display: block; }
.dg-chart text { font-family: var(--dg-sans); font-size: 13px; fill: var(--dg-ink); }
.dg-chart .dg-chart-count { font-weight: 600; fill: var(--dg-deep-900); }
.dg-chart .dg-chart-tick { fill: var(--dg-ink-soft); font-size: 11px; }
.dg-cover-art { margin-top: auto; padding-top: 1.5rem; display: flex; align-items: flex-end; justify-content: space-between; gap: 2rem; }
.dg-cover-art svg { width: 15rem; height: auto; flex: none; }
.dg-cover-art p { font-family: var(--dg-sans); font-size: 0.78rem; color: var(--dg-ink-soft); max-width: 22rem; line-height: 1.45; }
.dg-note { font-family: var(--dg-sans); font-size: 0.78rem; color: var(--dg-ink-soft); margin-top: 0.4rem; line-height: 1.4; }
.dg-most { list-style: none; margin: 0; padding: 0; counter-reset: most; }
.dg-most li { counter-increment: most; display: grid; grid-template-columns: 1.5rem 1fr; column-gap: 0.3rem; padding: 0.5rem 0; border-top: 1px solid var(--dg-cloth-200); font-size: 0.92rem; line-height: 1.3; }
.dg-most li::before { content: counter(most); grid-row: span 2; font-size: 1.3rem; line-height: 1.1; font-weight: 700; color: var(--dg-varnish-600); font-variant-numeric: lining-nums; }
.dg-most li b { font-family: var(--dg-sans); font-size: 0.78rem; font-weight: 600; color: var(--dg-deep-700); margin-top: 0.15rem; }

/* The write-ups */
.dg-writeups { margin-top: 3rem; }
.dg-section { margin-top: 2rem; }
.dg-section-head { display: flex; align-items: baseline; gap: 0.8rem; padding-bottom: 0.35rem; border-bottom: 2px solid var(--dg-deep-900); }
.dg-section-head .dg-count { font-family: var(--dg-sans); font-size: 0.8rem; color: var(--dg-ink-soft); }
.dg-entry { display: grid; grid-template-columns: minmax(0, 1fr); gap: 1.1rem; padding: 1.1rem 0 1.2rem; border-bottom: 1px solid var(--dg-cloth-300); }
.dg-entry.dg-has-photo { grid-template-columns: 9rem minmax(0, 1fr); }
.dg-thumb { width: 9rem; height: 7rem; object-fit: cover; border-radius: 0.25rem; background: var(--dg-cloth-100); display: block; }
.dg-entry h3 { font-size: 1.3rem; line-height: 1.25; font-weight: 600; }
.dg-entry h3 a { color: inherit; text-decoration: none; }
.dg-byline { margin-top: 0.25rem; font-family: var(--dg-sans); font-size: 0.8rem; color: var(--dg-ink-soft); }
.dg-byline strong { color: var(--dg-ink); font-weight: 600; }
.dg-summary { margin-top: 0.5rem; font-size: 1rem; line-height: 1.5; }
.dg-measures { margin-top: 0.7rem; border-collapse: collapse; font-family: var(--dg-sans); font-size: 0.78rem; width: 100%; }
.dg-measures caption { text-align: left; font-weight: 600; color: var(--dg-deep-700); padding-bottom: 0.2rem; }
.dg-measures th, .dg-measures td { text-align: left; padding: 0.25rem 0.6rem 0.25rem 0; border-top: 1px solid var(--dg-cloth-200); vertical-align: top; }
.dg-measures th { font-weight: 500; color: var(--dg-ink); width: 42%; }
.dg-dim-mm { color: var(--dg-ink-soft); }
.dg-measures td { font-variant-numeric: tabular-nums lining-nums; color: var(--dg-ink); }
.dg-entry-foot { margin-top: 0.6rem; display: flex; flex-wrap: wrap; gap: 0.3rem 1rem; font-family: var(--dg-sans); font-size: 0.75rem; color: var(--dg-ink-soft); }
.dg-tag { display: inline-block; padding: 0 0.35rem; border: 1px solid var(--dg-deep-200); color: var(--dg-deep-700); border-radius: 2px; }
.dg-done { color: var(--dg-varnish-600); font-weight: 600; }

/* Safety and the colophon */
.dg-safety { margin-top: 2.5rem; padding: 1rem 1.1rem; border-left: 4px solid var(--dg-boot-600); background: var(--dg-boot-50); }
.dg-safety h2 { font-size: 1.15rem; color: var(--dg-boot-800); }
.dg-safety ul { margin: 0.5rem 0 0; padding: 0; list-style: none; font-family: var(--dg-sans); font-size: 0.8rem; line-height: 1.45; }
.dg-safety li { margin-top: 0.45rem; }
.dg-safety li span { display: block; color: var(--dg-ink-soft); font-size: 0.72rem; }
.dg-colophon { margin-top: 1.5rem; font-family: var(--dg-sans); font-size: 0.75rem; color: var(--dg-ink-soft); }

@media (max-width: 40rem) {
  .dg-cover-title .dg-year { font-size: 3.6rem; }
  .dg-stats { grid-template-columns: repeat(2, minmax(0, 1fr)); }
  .dg-stat:nth-child(3) { border-left: 0; padding-left: 0; }
  .dg-contents ol { columns: 1; }
  .dg-figures-grid { grid-template-columns: 1fr; }
  .dg-entry.dg-has-photo { grid-template-columns: 1fr; }
}

@page { size: letter; margin: 0.7in 0.75in 0.8in; }
@media print {
  html, body { background: #fff !important; }
  .dg { font-size: 10.5pt; line-height: 1.45; }
  .dg a { color: inherit; text-decoration: none; }
  .dg-cover { break-after: page; min-height: 9.2in; padding-bottom: 0; }
  .dg-cover-art svg { width: 2.9in; }
  .dg-cover-title .dg-year { font-size: 66pt; }
  .dg-cover-title .dg-title { font-size: 24pt; }
  .dg-stats { margin-top: 1.4rem; }
  .dg-stat-value { font-size: 24pt; }
  .dg-contents { margin-top: 1.4rem; }
  .dg-contents ul li { font-size: 9pt; }
  .dg-letter { margin-top: 0; }
  .dg-figures { break-inside: avoid; margin-top: 1.8rem; }
  .dg-writeups { break-before: page; margin-top: 0; }
  .dg-section { margin-top: 1.4rem; }
  .dg-section:first-child { margin-top: 0; }
  .dg-section-head { break-after: avoid; }
  .dg-entry { break-inside: avoid; padding: 0.8rem 0 0.9rem; }
  .dg-entry h3 { font-size: 13pt; }
  .dg-summary { font-size: 10pt; }
  .dg-safety li { break-inside: avoid; }
  .dg-letter-body p, .dg-summary { orphans: 3; widows: 3; }
  .dg-draft-mark { display: block; }
  /* A busy year: a denser page, so the volume stays something one can print. */
  .dg-large { font-size: 9pt; line-height: 1.35; }
  .dg-large .dg-entry { padding: 0.45rem 0 0.5rem; gap: 0.7rem; }
  .dg-large .dg-entry.dg-has-photo { grid-template-columns: 5.5rem minmax(0, 1fr); }
  .dg-large .dg-thumb { width: 5.5rem; height: 4.1rem; }
  .dg-large .dg-entry h3 { font-size: 10.5pt; }
  .dg-large .dg-summary { font-size: 9pt; margin-top: 0.2rem; }
  .dg-large .dg-measures { margin-top: 0.3rem; font-size: 7.5pt; }
  .dg-large .dg-measures caption { display: none; }
  .dg-large .dg-measures th, .dg-large .dg-measures td { padding: 0.1rem 0.5rem 0.1rem 0; }
  .dg-large .dg-entry-foot { margin-top: 0.25rem; }
  /* Its contents: a section longer than a page may break (kept whole, it would leave the cover
     blank below "In this digest"); its name stays with its first titles, and no title is split. */
  .dg-large .dg-contents li.dg-toc-section { break-inside: auto; }
  .dg-large .dg-toc-name { display: block; break-after: avoid; }
  .dg-large .dg-contents ul li { break-inside: avoid; }
}
`;
