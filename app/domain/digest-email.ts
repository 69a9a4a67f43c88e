// The digest as an e-mail: a plain-text part and a simple HTML part with inline styles (mail
// programs ignore style sheets), each ending with the member's own unsubscribe link.
import { digestTitle, formatDigestDate, type DigestSnapshot } from "./digest";

export type DigestEmailLinks = {
  /** The issued edition on the web (/digest/:year). */
  web: string;
  /** Its PDF. */
  pdf: string;
  /** The member's own unsubscribe link (works without signing in). */
  unsubscribe: string;
  /** Where members change their e-mail choices. */
  account: string;
  /** A write-up's address, from its slug. */
  writeup: (slug: string) => string;
};

export type DigestEmail = { subject: string; text: string; html: string };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function creditLine(e: { credit: string; hullNumber: number | null; boatName: string | null }): string {
  const boat = e.boatName && !e.credit.includes(e.boatName) ? e.boatName : null;
  const hull = e.hullNumber !== null && !e.credit.includes(String(e.hullNumber)) ? `hull ${e.hullNumber}` : null;
  return [e.credit, boat, hull].filter(Boolean).join(", ");
}

/** The e-mail for one member. `letterHtml` is the editor's letter already rendered (sanitised). */
export function composeDigestEmail(snapshot: DigestSnapshot, className: string, links: DigestEmailLinks): DigestEmail {
  const title = digestTitle(snapshot.year, snapshot.edition);
  const subject = snapshot.edition > 1
    ? `${className} ${title.toLowerCase()} (a correction)`
    : `${className} ${title.toLowerCase()}`;
  const f = snapshot.figures;
  const included = snapshot.sections.reduce((n, s) => n + s.entries.length, 0);
  const figureLines = [
    `${f.writeupsPublished} write-up${f.writeupsPublished === 1 ? "" : "s"} published (${included} in this digest)`,
    `${f.spacesMeasured} space${f.spacesMeasured === 1 ? "" : "s"} measured, ${f.measurementsAdded} measurement${f.measurementsAdded === 1 ? "" : "s"} added`,
    `${f.newMembers} new member${f.newMembers === 1 ? "" : "s"}`,
  ];

  const text: string[] = [`${className} owners' association: ${title}`, ""];
  if (snapshot.issuedAt) text.push(`Issued ${formatDigestDate(snapshot.issuedAt)}.`, "");
  if (snapshot.correctionNote) text.push(`Correction: ${snapshot.correctionNote}`, "");
  if (snapshot.letterMarkdown.trim()) text.push(snapshot.letterMarkdown.trim(), "");
  text.push("THE YEAR IN FIGURES", ...figureLines.map((l) => `- ${l}`), "");
  for (const section of snapshot.sections) {
    text.push(section.name.toUpperCase());
    for (const e of section.entries) {
      text.push(`- ${e.title} (${creditLine(e)})`, `  ${links.writeup(e.slug)}`);
    }
    text.push("");
  }
  text.push(
    `Read it on the web: ${links.web}`,
    `Or print the PDF: ${links.pdf}`,
    "",
    "You receive this because you asked for the yearly digest in your profile.",
    `To stop receiving it: ${links.unsubscribe}`,
    `Your e-mail choices: ${links.account}`,
  );

  const p = 'style="margin:0 0 12px;font:16px/1.5 Georgia,serif;color:#1f2529"';
  const small = 'style="margin:0 0 8px;font:13px/1.5 Arial,sans-serif;color:#4d5a61"';
  const a = 'style="color:#1d4c5c"';
  const html: string[] = [
    '<!doctype html><html lang="en"><head><meta charset="utf-8"><title>' + escapeHtml(title) + "</title></head>",
    '<body style="margin:0;padding:0;background:#fdfbf6">',
    '<div style="max-width:640px;margin:0 auto;padding:24px">',
    `<p ${small}>${escapeHtml(className)} owners' association</p>`,
    `<h1 style="margin:0 0 8px;font:600 28px/1.2 Georgia,serif;color:#0f2a33">${escapeHtml(title)}</h1>`,
  ];
  if (snapshot.issuedAt) html.push(`<p ${small}>Issued ${escapeHtml(formatDigestDate(snapshot.issuedAt))}</p>`);
  if (snapshot.correctionNote) {
    html.push(`<p style="margin:0 0 16px;padding:8px 12px;border-left:4px solid #a8372a;background:#fbefec;font:15px/1.5 Arial,sans-serif;color:#6f2219"><strong>Correction:</strong> ${escapeHtml(snapshot.correctionNote)}</p>`);
  }
  if (snapshot.letterHtml.trim()) html.push(`<div style="font:16px/1.55 Georgia,serif;color:#1f2529">${snapshot.letterHtml}</div>`);
  html.push(`<h2 style="margin:24px 0 8px;font:600 20px/1.3 Georgia,serif;color:#0f2a33">The year in figures</h2><ul style="margin:0 0 16px;padding-left:20px;font:15px/1.6 Arial,sans-serif;color:#1f2529">`);
  for (const l of figureLines) html.push(`<li>${escapeHtml(l)}</li>`);
  html.push("</ul>");
  for (const section of snapshot.sections) {
    html.push(`<h2 style="margin:24px 0 8px;font:600 20px/1.3 Georgia,serif;color:#0f2a33">${escapeHtml(section.name)}</h2>`);
    for (const e of section.entries) {
      html.push(
        `<p ${p}><a ${a} href="${escapeHtml(links.writeup(e.slug))}"><strong>${escapeHtml(e.title)}</strong></a><br>`
        + `<span style="font:13px/1.5 Arial,sans-serif;color:#4d5a61">${escapeHtml(creditLine(e))}</span>`
        + (e.summary ? `<br>${escapeHtml(e.summary)}` : "")
        + "</p>",
      );
    }
  }
  html.push(
    `<p ${p}><a ${a} href="${escapeHtml(links.web)}">Read the digest on the web</a> · <a ${a} href="${escapeHtml(links.pdf)}">print the PDF</a></p>`,
    `<hr style="border:0;border-top:1px solid #dccfae;margin:24px 0">`,
    `<p ${small}>You receive this because you asked for the yearly digest in your profile. `
    + `<a ${a} href="${escapeHtml(links.unsubscribe)}">Stop sending me the digest</a> · <a ${a} href="${escapeHtml(links.account)}">your e-mail choices</a></p>`,
    "</div></body></html>",
  );
  return { subject, text: text.join("\n"), html: html.join("\n") };
}
