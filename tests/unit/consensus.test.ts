import { describe, expect, it } from "vitest";
import {
  boxConsensus,
  consensusBySection,
  consensusOf,
  median,
  medianAbsoluteDeviation,
} from "~/domain/consensus";

// Definitions checked here:
// - median: the middle value of the sorted data; for an even count, the mean of the two middle
//   values (NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.1 "Measures of Location").
// - MAD = median(|Y_i - median(Y)|) (NIST/SEMATECH e-Handbook, 1.3.5.6 "Measures of Scale").
// - Outlier limit max(3 x 1.4826 x MAD, 6.35 mm): Hampel identifier (Hampel 1974; Iglewicz &
//   Hoaglin 1993), with a 1/4 in floor (common practice); 1/4 in = 6.35 mm (NIST HB 44 App. C).

describe("median", () => {
  it("odd count: the middle value, whatever the input order", () => {
    expect(median([331, 329, 335])).toBe(331); // sorted 329, 331, 335 (by hand)
    expect(median([7])).toBe(7);
  });

  it("even count: the mean of the two middle values", () => {
    expect(median([300, 309, 302, 305])).toBe(303.5); // (302 + 305) / 2 (by hand)
    expect(median([1, 2])).toBe(1.5);
  });

  it("does not reorder the caller's array", () => {
    const values = [3, 1, 2];
    median(values);
    expect(values).toEqual([3, 1, 2]);
  });

  it("refuses empty input and non-numbers", () => {
    expect(() => median([])).toThrow(RangeError);
    expect(() => median([1, Number.NaN])).toThrow(RangeError);
  });
});

describe("median absolute deviation", () => {
  it("worked example, odd count", () => {
    // Worked by hand (NIST/SEMATECH e-Handbook 1.3.5.6 definition):
    //   data            330 331 333 336 352
    //   median          333
    //   |x - 333|         3   2   0   3  19
    //   sorted            0   2   3   3  19   -> MAD = 3
    expect(medianAbsoluteDeviation([330, 331, 333, 336, 352])).toBe(3);
  });

  it("worked example, even count", () => {
    // By hand: data 300 302 305 309, median 303.5,
    //   |x - 303.5| = 3.5 1.5 1.5 5.5, sorted 1.5 1.5 3.5 5.5 -> MAD = (1.5 + 3.5) / 2 = 2.5
    expect(medianAbsoluteDeviation([300, 302, 305, 309])).toBe(2.5);
  });
});

describe("consensusOf", () => {
  it("flags the far measurement in the worked example", () => {
    // By hand, data 330 331 333 336 352: median 333, MAD 3,
    //   limit = max(3 x 1.4826 x 3, 6.35) = max(13.3434, 6.35) = 13.3434
    //   |352 - 333| = 19 > 13.3434 -> flagged; the others are at most 3 away.
    //   spread = 352 - 330 = 22
    const r = consensusOf([330, 331, 333, 336, 352]);
    expect(r).not.toBeNull();
    expect(r?.consensus).toBe(333);
    expect(r?.mad).toBe(3);
    expect(r?.spread).toBe(22);
    expect(r?.count).toBe(5);
    expect(r?.outlierLimit).toBeCloseTo(13.3434, 10);
    expect(r?.outliers).toEqual([4]);
  });

  it("the spread counts a flagged value too (docs/decisions/0002-consensus-and-sections.md)", () => {
    // Heights of the port settee's forward bay (content-seed/spaces.yaml, invented demo data), in
    // inches: 11.75, 11.75, 12.75, 11.732. By hand: median 11.75; deviations 0, 0, 1, 0.018; MAD
    // 0.009 in; limit max(3 x 1.4826 x 0.009, 0.25) = 0.25 in; 12.75 is flagged. Spread over all
    // four: 12.75 - 11.732 = 1.018 in (it would be 0.018 in without the flagged one).
    const r = consensusOf([11.75, 11.75, 12.75, 11.732].map((v) => v * 25.4))!;
    expect(r.outliers).toEqual([2]);
    expect(r.spread / 25.4).toBeCloseTo(1.018, 9);
  });

  it("reports outliers by their position in the input", () => {
    const r = consensusOf([352, 330, 333, 331, 336]);
    expect(r?.outliers).toEqual([0]);
  });

  it("the Hampel term governs when the measurements scatter widely", () => {
    // By hand: data 300 302 305 309, median 303.5, MAD 2.5,
    //   limit = max(3 x 1.4826 x 2.5, 6.35) = 11.1195; largest distance 5.5 -> none flagged
    const r = consensusOf([300, 302, 305, 309]);
    expect(r?.consensus).toBe(303.5);
    expect(r?.outlierLimit).toBeCloseTo(11.1195, 10);
    expect(r?.outliers).toEqual([]);
  });

  it("the 1/4 in floor governs when most agree exactly", () => {
    // By hand: data 300 300 300 306 307, median 300, |x - 300| = 0 0 0 6 7, MAD 0.
    //   The Hampel term alone is 0 and would flag both 306 and 307; with the floor the limit is
    //   6.35, so only 307 (7 > 6.35) is flagged.
    const r = consensusOf([300, 300, 300, 306, 307]);
    expect(r?.mad).toBe(0);
    expect(r?.outlierLimit).toBe(6.35);
    expect(r?.outliers).toEqual([4]);
  });

  it("a value exactly at the limit is not flagged; just beyond it is", () => {
    // 6.35 from the median: at the limit, not farther than it.
    expect(consensusOf([300, 300, 306.35])?.outliers).toEqual([]);
    expect(consensusOf([300, 300, 306.36])?.outliers).toEqual([2]);
    expect(consensusOf([300, 300, 293.64])?.outliers).toEqual([2]);
  });

  it("flags nothing with fewer than 3 measurements", () => {
    const two = consensusOf([300, 340]);
    expect(two?.consensus).toBe(320);
    expect(two?.spread).toBe(40);
    expect(two?.outliers).toEqual([]);
    expect(two?.outlierLimit).toBeNull();
  });

  it("a single measurement is its own consensus", () => {
    expect(consensusOf([342.9])).toEqual({
      consensus: 342.9,
      spread: 0,
      mad: 0,
      count: 1,
      outliers: [],
      outlierLimit: null,
    });
  });

  it("empty input gives no consensus", () => {
    expect(consensusOf([])).toBeNull();
  });

  it("refuses values that are not finite numbers", () => {
    expect(() => consensusOf([300, Number.POSITIVE_INFINITY, 301])).toThrow(RangeError);
  });

  it("one wild value does not move the consensus (property)", () => {
    const base = [330, 331, 333, 336];
    for (const wild of [0.5, 100, 2000, 9999]) {
      const r = consensusOf([...base, wild]);
      // The median of 5 lies between the 2nd and 4th smallest of the base values.
      expect(r?.consensus).toBeGreaterThanOrEqual(331);
      expect(r?.consensus).toBeLessThanOrEqual(336);
      expect(r?.outliers).toEqual([4]);
    }
  });
});

describe("boxConsensus", () => {
  it("takes each dimension on its own and lists the measurements to check", () => {
    // Three members measured the same locker (mm).
    const r = boxConsensus([
      { length: 610, width: 330, height: 254 },
      { length: 612, width: 333, height: 251 },
      { length: 608, width: 356, height: 253 }, // width 356: 23 mm off
    ]);
    expect(r).not.toBeNull();
    if (!r) return;
    // By hand: medians 610, 333, 253; the box need not be any one member's measurement.
    expect([r.length.consensus, r.width.consensus, r.height.consensus]).toEqual([610, 333, 253]);
    // Width: |x - 333| = 3 0 23, MAD 3, limit max(13.3434, 6.35); 23 flagged.
    expect(r.width.outliers).toEqual([2]);
    expect(r.length.outliers).toEqual([]);
    expect(r.height.outliers).toEqual([]);
    expect(r.outliers).toEqual([2]);
    expect(r.count).toBe(3);
  });

  it("collects outliers from every dimension once each, in order", () => {
    const ok = { length: 600, width: 300, height: 250 };
    const r = boxConsensus([
      ok,
      { ...ok, height: 290 },
      ok,
      { ...ok, length: 640, width: 330 },
      ok,
    ]);
    expect(r?.outliers).toEqual([1, 3]);
  });

  it("empty input gives no consensus", () => {
    expect(boxConsensus([])).toBeNull();
  });
});

describe("consensusBySection: each part of a space on its own", () => {
  const box = (length: number, width: number, height: number) => ({ length, width, height });
  it("medians by hand, never mixing parts; flags named by measurement", () => {
    const c = consensusBySection([
      { section: 0, box: box(331, 390, 320) },
      { section: 1, box: box(127, 203, 229) },
      { section: 0, box: box(329, 392, 318) },
      { section: 0, box: box(335, 391, 400) }, // height 400: 80 mm from the median of 318, 320, 400 (320)
      { section: 1, box: box(133, 205, 231) },
    ]);
    // Part 0 lengths 331, 329, 335: sorted 329, 331, 335 -> 331; heights 318, 320, 400 -> 320.
    expect(c.bySection.get(0)!.length.consensus).toBe(331);
    expect(c.bySection.get(0)!.height.consensus).toBe(320);
    // Part 1 lengths 127, 133: an even count, (127 + 133) / 2 = 130; spread 6.
    expect(c.bySection.get(1)!.length.consensus).toBe(130);
    expect(c.bySection.get(1)!.length.spread).toBe(6);
    expect(c.bySection.get(1)!.count).toBe(2);
    expect(c.bySection.has(2)).toBe(false);
    // MAD of heights 318, 320, 400 is median(2, 0, 80) = 2; limit max(3 x 1.4826 x 2, 6.35) = 8.8956;
    // 400 is 80 from 320: flagged. Two measurements of part 1: nothing is flagged.
    expect(c.flagged).toEqual([[], [], [], ["height"], []]);
  });

  it("no measurements: nothing; a section that is not a position is refused", () => {
    expect(consensusBySection([]).bySection.size).toBe(0);
    expect(() => consensusBySection([{ section: -1, box: box(1, 1, 1) }])).toThrow(RangeError);
  });
});
