/**
 * Words on the pages of the spaces: who measured, and the names of spaces as typeset.
 */

/**
 * The credit a member chose, without the hull numbers it names, for a line that states the hull
 * measured on its own (a member with two boats measured one of them):
 * "Ruth Ambler, hull 288" -> "Ruth Ambler"; "Doug Pardoe, hulls 579 and 34" -> "Doug Pardoe";
 * "Joan P., Lark Rising (97)" -> "Joan P., Lark Rising". Only ever takes words away, so it shows
 * nothing the member did not choose to show. A credit that is nothing but hull numbers is kept.
 */
export function creditWithoutHulls(credit: string): string {
  const stripped = credit
    // ", hull 288", ", hulls 579 and 34", ", hull no. 12", ", hulls 3, 4 & 5"
    .replace(/,?\s*\bhulls?\s+(?:no\.?\s*|#\s*)?\d+(?:\s*(?:,|and|&|\+|–|-)\s*\d+)*/gi, "")
    // "(402)", "(hull 402)", "(#402)"
    .replace(/\s*\(\s*(?:hulls?\s*)?#?\s*\d+\s*\)/gi, "")
    .replace(/\s+,/g, ",")
    .replace(/[\s,;·-]+$/, "")
    .trim();
  return stripped === "" ? credit.trim() : stripped;
}

/**
 * A name as typeset on the site: a range of hull numbers takes an en dash, as
 * `describeHullRange` writes it ("Under the starboard settee, aft bay (hulls 120-298)" ->
 * "… (hulls 120–298)"). Only a range after "hull"/"hulls" is touched.
 */
export function typesetHullRanges(name: string): string {
  return name.replace(/\b(hulls?\s+\d+)\s*-\s*(\d+)\b/gi, "$1–$2");
}

/**
 * The sentence above the register of spaces, saying which filter applies. A hull number is the
 * more exact of the two, so when both are given the hull number applies and the variant is set
 * aside, and the sentence says so:
 * "13 spaces on hull 318 (Mk II); the variant chosen (Mk I) is set aside while a hull number is given."
 */
export function describeSpaceFilter(f: {
  count: number;
  /** A valid hull number, or null. */
  hull: number | null;
  /** The variant the hull belongs to ("Mk II"), if any. */
  hullVariant: string | null;
  /** The variant chosen: its label ("Mk I") and hulls; null for all hulls. */
  variant: { label: string; from: number; to: number } | null;
}): string {
  const spaces = `${f.count} ${f.count === 1 ? "space" : "spaces"}`;
  if (f.hull !== null) {
    const on = `${spaces} on hull ${f.hull}${f.hullVariant ? ` (${f.hullVariant})` : ""}`;
    return f.variant ? `${on}; the variant chosen (${f.variant.label}) is set aside while a hull number is given.` : `${on}.`;
  }
  if (f.variant) return `${spaces} on ${f.variant.label} (hulls ${f.variant.from}–${f.variant.to}).`;
  return `${spaces}.`;
}
