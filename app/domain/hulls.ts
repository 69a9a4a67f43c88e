// Hull numbers and production variants of the class this installation serves.
// The demo class (invented): 612 hulls, Mk I hulls 1-298, Mk II hulls 299-612.

export const CLASS_NAME = "Brantwater 22";
export const FIRST_HULL = 1;
export const LAST_HULL = 612;

export type Variant = { key: string; label: string; from: number; to: number };

export const VARIANTS: readonly Variant[] = [
  { key: "mk1", label: "Mk I", from: 1, to: 298 },
  { key: "mk2", label: "Mk II", from: 299, to: 612 },
];

export function variantOf(hull: number): Variant | undefined {
  return VARIANTS.find((v) => hull >= v.from && hull <= v.to);
}

export type HullRange = { from: number; to: number };

/** "all", a variant key ("mk1") or a range "120-298" (or "298-120", the same hulls) -> a range of hull numbers. */
export function parseAppliesTo(value: string | number): HullRange | { error: string } {
  const text = String(value).trim().toLowerCase();
  if (text === "all") return { from: FIRST_HULL, to: LAST_HULL };
  const variant = VARIANTS.find((v) => v.key === text);
  if (variant) return { from: variant.from, to: variant.to };
  const m = /^(\d+)\s*(?:-|to|–)\s*(\d+)$/.exec(text);
  if (m) {
    const a = Number(m[1]);
    const b = Number(m[2]);
    // Written the other way round ("298-120"), a range means the same hulls.
    const [low, high] = a <= b ? [a, b] : [b, a];
    if (low < FIRST_HULL || high > LAST_HULL) {
      return { error: `Hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` };
    }
    return { from: low, to: high };
  }
  return { error: 'Say "all", a variant (Mk I, Mk II) or a hull-number range such as 120-298.' };
}

/** Words for a range: "All hulls", "Mk II (hulls 299-612)", "Hulls 120-298". */
export function describeHullRange({ from, to }: HullRange): string {
  if (from === FIRST_HULL && to === LAST_HULL) return "All hulls";
  const variant = VARIANTS.find((v) => v.from === from && v.to === to);
  if (variant) return `${variant.label} (hulls ${from}–${to})`;
  return from === to ? `Hull ${from}` : `Hulls ${from}–${to}`;
}

export function rangeIncludes(range: HullRange, hull: number): boolean {
  return hull >= range.from && hull <= range.to;
}

/**
 * The hull number to show beside an author's credit, or null when the credit already names it
 * ("Nora P., hull 147" needs no second "hull 147").
 */
export function hullBesideCredit(credit: string, hull: number | null): number | null {
  if (hull === null) return null;
  return new RegExp(`(^|\\D)${hull}(\\D|$)`).test(credit) ? null : hull;
}

/** The same words in the middle of a sentence: "applies to hull 318", "to hulls 120–298", "to Mk II (hulls 299–612)". */
export function describeHullRangeInSentence(range: HullRange): string {
  return describeHullRange(range).replace(/^(All hulls|Hulls?)\b/, (w) => w.toLowerCase());
}
