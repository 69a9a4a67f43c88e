// The yearly digest: the shapes an edition is made of and the pure rules for compiling,
// ordering and freezing it. No I/O here; app/models/digests.server.ts reads and writes.

/** One measured space named in a write-up, as the digest prints it. Lengths in millimetres. */
export type DigestMeasurement = {
  space: string;
  lengthMm: number;
  widthMm: number;
  heightMm: number;
  /** How many members measured it (the consensus is shown when more than one did). */
  measurements: number;
};

export type DigestEntry = {
  writeupId: number;
  slug: string;
  title: string;
  /** How the author wants to be credited (credit_as, else the display name). */
  credit: string;
  hullNumber: number | null;
  boatName: string | null;
  summary: string;
  publishedAt: string; // ISO date-time
  systems: string[]; // names
  /** Object key of the first photo's thumbnail (served at /media/<key>), if any. */
  thumbnailKey: string | null;
  thumbnailAlt: string;
  measurements: DigestMeasurement[];
  doneToo: number;
};

export type DigestSection = { slug: string; name: string; entries: DigestEntry[] };

export type DigestFigures = {
  writeupsPublished: number;
  perSystem: { slug: string; name: string; count: number }[];
  spacesMeasured: number;
  measurementsAdded: number;
  mostDoneToo: { slug: string; title: string; count: number }[];
  newMembers: number;
};

/** Everything an issued edition shows, frozen when it is issued so it never changes. */
export type DigestSnapshot = {
  year: number;
  edition: number;
  issuedAt: string | null;
  letterMarkdown: string;
  /** The letter as sanitised HTML (app/domain/markdown.ts), frozen with the rest. */
  letterHtml: string;
  correctionNote: string;
  figures: DigestFigures;
  sections: DigestSection[];
};

/** The years a digest may cover (the class's first hull was built in 1971). */
export const DIGEST_FIRST_YEAR = 1971;
export const DIGEST_LAST_YEAR = 2200;

/** Where a write-up without any system is listed. */
export const UNFILED_SECTION = { slug: "", name: "Other work" } as const;

/** How many write-ups the "done on the most boats" figure names. */
export const MOST_DONE_TOO_LIMIT = 5;

/**
 * Beyond this many write-ups a digest is a reference volume: set more densely in print (its PDF
 * is tagged for screen readers all the same).
 */
export const DIGEST_LARGE_ENTRIES = 150;

/** One entry of a draft as the secretary arranges it. */
export type DraftEntry = { writeupId: number; sectionSlug: string; position: number; included: boolean };

/** The section a write-up is listed under: its first system in the taxonomy's order. */
export function sectionFor(systemSlugs: readonly string[], sectionOrder: readonly string[]): string {
  let best: string | null = null;
  let bestRank = Infinity;
  for (const slug of systemSlugs) {
    const rank = sectionOrder.indexOf(slug);
    const r = rank === -1 ? sectionOrder.length : rank;
    if (r < bestRank) {
      best = slug;
      bestRank = r;
    }
  }
  return best ?? UNFILED_SECTION.slug;
}

function sectionRank(slug: string, sectionOrder: readonly string[]): number {
  const i = sectionOrder.indexOf(slug);
  // Unknown systems after the known ones; "Other work" last of all.
  return slug === UNFILED_SECTION.slug ? sectionOrder.length + 1 : i === -1 ? sectionOrder.length : i;
}

/**
 * The first arrangement of a year's write-ups: by section (the taxonomy's order), then by the
 * date of publication, oldest first. Every entry is in, numbered 0, 1, 2 ... in that order.
 */
export function initialArrangement(
  writeups: readonly { writeupId: number; systems: readonly string[]; publishedAt: Date | string }[],
  sectionOrder: readonly string[],
): DraftEntry[] {
  const time = (d: Date | string) => (d instanceof Date ? d : new Date(d)).getTime();
  return writeups
    .map((w) => ({ w, section: sectionFor(w.systems, sectionOrder) }))
    .sort((a, b) =>
      sectionRank(a.section, sectionOrder) - sectionRank(b.section, sectionOrder)
      || time(a.w.publishedAt) - time(b.w.publishedAt)
      || a.w.writeupId - b.w.writeupId)
    .map(({ w, section }, position) => ({ writeupId: w.writeupId, sectionSlug: section, position, included: true }));
}

/** Entries in the order the digest prints them: by section, then by position. */
export function orderedEntries<T extends DraftEntry>(entries: readonly T[], sectionOrder: readonly string[]): T[] {
  return [...entries].sort((a, b) =>
    sectionRank(a.sectionSlug, sectionOrder) - sectionRank(b.sectionSlug, sectionOrder)
    || a.position - b.position
    || a.writeupId - b.writeupId);
}

/**
 * Moves one entry a place up or down among the entries of its own section (a write-up stays
 * under its system). Returns every entry with fresh positions 0, 1, 2 ... in printing order, or
 * null when the entry is not there or is already first (up) or last (down) of its section.
 */
export function moveEntry(
  entries: readonly DraftEntry[],
  writeupId: number,
  direction: "up" | "down",
  sectionOrder: readonly string[],
): DraftEntry[] | null {
  const list = orderedEntries(entries, sectionOrder).map((e) => ({ ...e }));
  const i = list.findIndex((e) => e.writeupId === writeupId);
  if (i === -1) return null;
  const j = direction === "up" ? i - 1 : i + 1;
  if (j < 0 || j >= list.length || list[j].sectionSlug !== list[i].sectionSlug) return null;
  [list[i], list[j]] = [list[j], list[i]];
  return list.map((e, position) => ({ ...e, position }));
}

/** Groups the entries that are in, in printing order, under their sections. */
export function groupIntoSections<T extends DraftEntry>(
  entries: readonly T[],
  sections: readonly { slug: string; name: string }[],
): { slug: string; name: string; entries: T[] }[] {
  const order = sections.map((s) => s.slug);
  const groups: { slug: string; name: string; entries: T[] }[] = [];
  for (const e of orderedEntries(entries.filter((x) => x.included), order)) {
    let group = groups.at(-1);
    if (!group || group.slug !== e.sectionSlug) {
      const name = sections.find((s) => s.slug === e.sectionSlug)?.name ?? UNFILED_SECTION.name;
      group = { slug: e.sectionSlug, name, entries: [] };
      groups.push(group);
    }
    group.entries.push(e);
  }
  return groups;
}

/** What stops a draft from being issued, as sentences for the secretary. */
export function issueProblems(draft: { edition: number; included: number; correctionNote: string }): string[] {
  const problems: string[] = [];
  if (draft.included === 0) problems.push("Put at least one write-up in the digest before issuing it.");
  if (draft.edition > 1 && draft.correctionNote.trim().length < 10) {
    problems.push("Say in the correction note what this edition corrects (a sentence or more).");
  }
  return problems;
}

/** "Yearly digest 2025", and "Yearly digest 2025, edition 2" for a correction. */
export function digestTitle(year: number, edition = 1): string {
  return edition > 1 ? `Yearly digest ${year}, edition ${edition}` : `Yearly digest ${year}`;
}

/** The PDF's file name: "brantwater-22-digest-2025.pdf", "...-2025-edition-2.pdf". */
export function digestFileName(className: string, year: number, edition: number): string {
  const stem = `${className}-digest-${year}`.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");
  return edition > 1 ? `${stem}-edition-${edition}.pdf` : `${stem}.pdf`;
}

/**
 * The object key of the first photo of a write-up's Markdown (an image from our own photo store,
 * /media/photos/...webp), as its thumbnail's key; null when the write-up has no photo.
 */
export function firstPhotoThumbnail(markdown: string): { key: string; alt: string } | null {
  const m = /!\[([^\]]*)\]\(\s*\/media\/(photos\/\d{4}\/[A-Za-z0-9_-]{22})(?:\.thumb)?\.webp(?:\s+"[^"]*")?\s*\)/.exec(markdown);
  return m ? { key: `${m[2]}.thumb.webp`, alt: m[1].trim() } : null;
}

/** Splits a list into batches of at most `size`, in order (the e-mail goes out batch by batch). */
export function inBatches<T>(items: readonly T[], size: number): T[][] {
  if (!Number.isInteger(size) || size < 1) throw new RangeError(`batch size must be a positive whole number, not ${size}`);
  const batches: T[][] = [];
  for (let i = 0; i < items.length; i += size) batches.push(items.slice(i, i + size));
  return batches;
}

// One formatter for every date (toLocaleDateString would build a new one per call).
const DATE_FORMAT = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

/** "14 May 2025": dates in the digest, in UTC so that the server's zone does not move them. */
export function formatDigestDate(iso: string | Date): string {
  return DATE_FORMAT.format(iso instanceof Date ? iso : new Date(iso));
}

/**
 * The e-mail goes out in batches: this many messages per batch, each batch due this long after the
 * previous one, so a relay's hourly or per-minute sending limits are not hit at once (common practice).
 */
export const DIGEST_MAIL_BATCH_SIZE = 100;
export const DIGEST_MAIL_BATCH_GAP_MS = 60_000;
