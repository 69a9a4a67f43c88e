// The sorted-dimension nesting criterion behind the fit search's index, checked against brute
// force over every orientation, with property-based tests (fast-check).
//
// Source: Cormen, Leiserson, Rivest, Stein, Introduction to Algorithms, 3rd ed., Problem 24-2
// ("Nesting boxes"): a d-dimensional box x nests within y when some permutation of x's
// dimensions is smaller than y's, dimension by dimension; it does exactly when x's dimensions,
// sorted, are each smaller than y's, sorted. The fit uses the same criterion with "at most"
// and a clearance added to each of the item's dimensions (twice: one each side).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { fitItem, fitsSorted, placeRow, sortedDims, type Box, type Orientation } from "~/domain/fit";
import { candidateCorner, candidateRegions } from "~/domain/fit-search";

// Sizes in whole sixteenths of an inch, so that the brute force below is exact integer
// arithmetic and equal sizes (a box that fits exactly) come up often.
const MM_PER_SIXTEENTH = 25.4 / 16; // 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C)
type Sixteenths = [number, number, number];

const toBox = ([l, w, h]: Sixteenths): Box => ({
  length: l * MM_PER_SIXTEENTH,
  width: w * MM_PER_SIXTEENTH,
  height: h * MM_PER_SIXTEENTH,
});

/** All orderings of the item's three dimensions along the space's (length, width, height). */
function permutations([a, b, c]: Sixteenths): Sixteenths[] {
  return [[a, b, c], [a, c, b], [b, a, c], [b, c, a], [c, a, b], [c, b, a]];
}

/** Brute force: does some allowed orientation put every item dimension + 2c within the space's? */
function bruteFits(item: Sixteenths, space: Sixteenths, orientation: Orientation, c: number): boolean {
  const options = orientation === "upright"
    ? [[item[0], item[1], item[2]], [item[1], item[0], item[2]]] as Sixteenths[] // height stays vertical
    : permutations(item);
  return options.some((p) => p.every((d, i) => d + 2 * c <= space[i]));
}

// Items and spaces from 1 to 40 in, in sixteenths; clearance 0 to 1 in.
const dim = fc.integer({ min: 16, max: 640 });
const dims = fc.tuple(dim, dim, dim);
const clearance = fc.integer({ min: 0, max: 16 });
const orientation = fc.constantFrom<Orientation>("any", "upright");
/** A space built close to the item (a few sixteenths either way), so that both answers are common. */
const nearby = (item: Sixteenths) =>
  fc.tuple(fc.integer({ min: -8, max: 40 }), fc.integer({ min: -8, max: 40 }), fc.integer({ min: -8, max: 40 }), fc.integer({ min: 0, max: 5 }))
    .map(([x, y, z, turn]) => {
      const space = permutations(item)[turn].map((d, i) => Math.max(1, d + [x, y, z][i])) as Sixteenths;
      return space;
    });

const cases = fc.tuple(dims, clearance, orientation).chain(([item, c, o]) =>
  fc.tuple(fc.constant(item), fc.oneof(dims, nearby(item)), fc.constant(c), fc.constant(o)));

const RUNS = { numRuns: 3000 };

describe("the sorted-dimension criterion (Cormen et al., 3rd ed., Problem 24-2) against brute force", () => {
  it("fitsSorted on sortedDims gives the brute-force answer over all six (or, upright, two) orientations", () => {
    fc.assert(
      fc.property(cases, ([item, space, c, o]) => {
        const expected = bruteFits(item, space, o, c);
        const got = fitsSorted(sortedDims(toBox(item), o), sortedDims(toBox(space), o), c * MM_PER_SIXTEENTH);
        expect(got).toBe(expected);
      }),
      RUNS,
    );
  });

  it("the full fit check agrees with brute force, and its placement is one that brute force accepts", () => {
    fc.assert(
      fc.property(cases, ([item, space, c, o]) => {
        const expected = bruteFits(item, space, o, c);
        const r = fitItem({ item: toBox(item), orientation: o, clearanceMm: c * MM_PER_SIXTEENTH, space: { sections: [toBox(space)] } });
        expect(r.sections[0].fits).toBe(expected);
        if (expected) {
          const p = r.sections[0].placement;
          const named = { length: item[0], width: item[1], height: item[2] };
          const placed: Sixteenths = [named[p.length], named[p.width], named[p.height]];
          expect(placed.every((d, i) => d + 2 * c <= space[i])).toBe(true);
          if (o === "upright") expect(p.height).toBe("height");
        }
      }),
      RUNS,
    );
  });

  it("a row of one is exactly a fit", () => {
    fc.assert(
      fc.property(cases, ([item, space, c, o]) => {
        const row = placeRow(toBox(item), toBox(space), o, c * MM_PER_SIXTEENTH, 1);
        expect(row !== null).toBe(bruteFits(item, space, o, c));
      }),
      RUNS,
    );
  });

  it("a row of n fits exactly when some orientation puts n items and n + 1 gaps along a horizontal side", () => {
    fc.assert(
      fc.property(cases, fc.integer({ min: 2, max: 4 }), ([item, space, c, o], n) => {
        const options = o === "upright"
          ? [[item[0], item[1], item[2]], [item[1], item[0], item[2]]] as Sixteenths[]
          : permutations(item);
        const expected = options.some(([a, b, h]) =>
          h + 2 * c <= space[2] &&
          ((n * a + (n + 1) * c <= space[0] && b + 2 * c <= space[1]) ||
            (a + 2 * c <= space[0] && n * b + (n + 1) * c <= space[1])));
        const row = placeRow(toBox(item), toBox(space), o, c * MM_PER_SIXTEENTH, n);
        expect(row !== null).toBe(expected);
        // The database's regions for a row never leave out a space that takes it.
        const { index, corners } = candidateRegions(toBox(item), o, c * MM_PER_SIXTEENTH, n);
        const sorted = sortedDims(toBox(space), index);
        const inSome = corners.some((corner) => sorted.every((d, i) => d >= corner[i]));
        if (expected) expect(inSome).toBe(true);
        // Exact, too: on a 1/16 in grid nothing sits within the slack of a limit without reaching it.
        expect(inSome).toBe(expected);
      }),
      RUNS,
    );
  });

  it("the database's candidate region never leaves out a space that brute force accepts", () => {
    fc.assert(
      fc.property(cases, ([item, space, c, o]) => {
        const corner = candidateCorner(toBox(item), o, c * MM_PER_SIXTEENTH);
        const inRegion = sortedDims(toBox(space), o).every((d, i) => d >= corner[i]);
        if (bruteFits(item, space, o, c)) expect(inRegion).toBe(true);
        // And it is no looser than the exact test by more than its slack (a thousandth of a mm):
        // sizes on a 1/16 in grid never sit that close to a limit without reaching it.
        expect(inRegion).toBe(bruteFits(item, space, o, c));
      }),
      RUNS,
    );
  });

  it("nesting is transitive (Problem 24-2, part a)", () => {
    const grow = fc.tuple(fc.integer({ min: 0, max: 32 }), fc.integer({ min: 0, max: 32 }), fc.integer({ min: 0, max: 32 }), fc.integer({ min: 0, max: 5 }));
    // b is a turned copy of a, grown a little; c likewise of b: a nests in b, b in c.
    const bigger = (x: Sixteenths, [dx, dy, dz, turn]: [number, number, number, number]) =>
      permutations(x.map((d, i) => d + [dx, dy, dz][i]) as Sixteenths)[turn];
    fc.assert(
      fc.property(dims, grow, grow, (a, g1, g2) => {
        const nests = (x: Sixteenths, y: Sixteenths) => fitsSorted(sortedDims(toBox(x)), sortedDims(toBox(y)), 0);
        const b = bigger(a, g1);
        const c = bigger(b, g2);
        expect(nests(a, b) && nests(b, c)).toBe(true);
        expect(nests(a, c)).toBe(true);
        expect(bruteFits(a, c, "any", 0)).toBe(true);
      }),
      RUNS,
    );
  });

  it("the generated cases include both answers", () => {
    const sample = fc.sample(cases, 2000);
    const answers = sample.map(([item, space, c, o]) => bruteFits(item, space, o, c));
    expect(answers.filter(Boolean).length).toBeGreaterThan(200);
    expect(answers.filter((x) => !x).length).toBeGreaterThan(200);
  });
});
