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
  correctionNote: string;
  figures: DigestFigures;
  sections: DigestSection[];
};
