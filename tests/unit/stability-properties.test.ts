// Properties of the heel and trim relations (fast-check), and MCT1 given directly.
// The relations: tan θ = Σ w·y / (Δ·GM) (ASTM F1321; Nicholls, Seamanship and Nautical Knowledge),
// trim = Σ w·(x − LCF) / MCT1 with MCT1 = Δ·GM_L / (12·L) (Nicholls).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  calibrateGm,
  heelFromMoment,
  ledgerCondition,
  levelByAdding,
  levelByMoving,
  whatIfMove,
  type BoatParticulars,
  type LedgerItem,
} from "~/domain/stability";

// Invented demo particulars of the Brantwater 22 (product brief), GM_L invented.
const boat: BoatParticulars = {
  lightDisplacementLb: 2850,
  gmFt: 2.8,
  lwlFt: 19 + 2 / 12,
  lcfAftOfBowIn: 150,
  waterlineForwardEndAftOfBowIn: 12,
  gmLongitudinalFt: 36,
  beamFt: 7 + 10 / 12,
};

const weight = fc.double({ min: 1, max: 300, noNaN: true });
const aft = fc.double({ min: 0, max: 280, noNaN: true });
const off = fc.double({ min: -47, max: 47, noNaN: true });
const height = fc.double({ min: 0, max: 60, noNaN: true });

const item = fc.record({ weightLb: weight, aftOfBowIn: aft, offCentreIn: off, heightIn: height });
const ledger = fc.array(item, { minLength: 1, maxLength: 12 }).map((xs): LedgerItem[] => xs.map((x, i) => ({ id: `i${i}`, ...x })));

describe("moving a weight and back returns to the start", () => {
  it("heel, trim and GM come back (the GM after the first move is the boat's GM for the second)", () => {
    fc.assert(
      fc.property(ledger, fc.nat(), aft, off, height, (items, pick, toAft, toOff, toHeight) => {
        const moved = items[pick % items.length];
        const there = whatIfMove(boat, items, moved.id, { aftOfBowIn: toAft, offCentreIn: toOff, heightIn: toHeight });
        const back = whatIfMove({ ...boat, gmFt: there.after.gmFt }, there.items, moved.id, {
          aftOfBowIn: moved.aftOfBowIn,
          offCentreIn: moved.offCentreIn,
          heightIn: moved.heightIn,
        });
        const start = ledgerCondition(boat, items);
        expect(back.after.heelDeg).toBeCloseTo(start.heelDeg, 9);
        expect(back.after.gmFt).toBeCloseTo(boat.gmFt, 9);
        expect(back.after.trim?.changeIn).toBeCloseTo(start.trim?.changeIn as number, 9);
        expect(back.after.transverseMomentFtLb).toBeCloseTo(start.transverseMomentFtLb, 9);
      }),
      { numRuns: 300 },
    );
  });
});

describe("heel grows with the moment", () => {
  it("for any displacement and GM, a larger moment gives a larger heel, and the sign follows the moment", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 100, max: 20_000, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: -5_000, max: 5_000, noNaN: true }),
        fc.double({ min: 0.001, max: 5_000, noNaN: true }),
        (displacement, gm, m, more) => {
          const a = heelFromMoment(m, displacement, gm);
          const b = heelFromMoment(m + more, displacement, gm);
          expect(b).toBeGreaterThan(a);
          if (Math.abs(m) > 1e-9) expect(Math.sign(a)).toBe(Math.sign(m));
        },
      ),
      { numRuns: 500 },
    );
  });

  it("moving one item further to starboard heels the boat further to starboard", () => {
    fc.assert(
      fc.property(ledger, fc.nat(), off, fc.double({ min: 0.01, max: 20, noNaN: true }), (items, pick, y, dy) => {
        const id = items[pick % items.length].id;
        const at = (offCentreIn: number) => ledgerCondition(boat, items.map((i) => (i.id === id ? { ...i, offCentreIn } : i))).heelDeg;
        expect(at(y + dy)).toBeGreaterThan(at(y));
      }),
      { numRuns: 300 },
    );
  });
});

describe("the inverse brings her upright", () => {
  it("moving an item by levelByMoving's shift, or adding levelByAdding's weight, leaves no heel", () => {
    fc.assert(
      fc.property(ledger, fc.nat(), fc.double({ min: 5, max: 47, noNaN: true }), (items, pick, y) => {
        const id = items[pick % items.length].id;
        const plan = levelByMoving(boat, items, id);
        const moved = items.map((i) => (i.id === id ? { ...i, offCentreIn: plan.newOffCentreIn } : i));
        expect(ledgerCondition(boat, moved).heelDeg).toBeCloseTo(0, 9);
        for (const side of [-y, y]) {
          const w = levelByAdding(items, side);
          if (w === null) continue;
          const added = [...items, { id: "added", weightLb: w, aftOfBowIn: 150, offCentreIn: side }];
          expect(ledgerCondition(boat, added).heelDeg).toBeCloseTo(0, 9);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("a GM calibrated from the heel it predicts is the GM it started from (ASTM F1321 both ways)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 300, noNaN: true }),
        fc.double({ min: 1, max: 90, noNaN: true }),
        fc.double({ min: 2000, max: 6000, noNaN: true }),
        fc.double({ min: 0.5, max: 6, noNaN: true }),
        (w, shiftIn, displacement, gm) => {
          const heel = heelFromMoment((w * shiftIn) / 12, displacement, gm);
          expect(calibrateGm({ weightLb: w, shiftIn, displacementLb: displacement, heel: { degrees: heel } })).toBeCloseTo(gm, 8);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("MCT1 given directly", () => {
  it("is used as it stands when there is no GM_L (Nicholls: MCT1 480 ft-t, 40 t moved 36 ft → 3 in)", () => {
    // Nicholls's example in the ledger's units (the weight unit cancels): one 40-unit item 36 ft
    // (432 in) aft of the LCF with MCT1 480 trims her 3 in by the stern.
    const particulars: BoatParticulars = { ...boat, gmLongitudinalFt: undefined, mct1FtLbPerIn: 480 };
    const c = ledgerCondition(particulars, [{ id: "x", weightLb: 40, aftOfBowIn: 150 + 432, offCentreIn: 0 }]);
    expect(c.trim?.mct1FtLbPerIn).toBe(480);
    expect(c.trim?.changeIn).toBeCloseTo(3, 10);
    expect(c.trim?.sense).toBe("by the stern");
  });

  it("GM_L wins when both are given", () => {
    // MCT1 = Δ·GM_L / (12·L) (Nicholls). By hand: Δ = 2850 + 150 = 3000 lb, GM_L 36 ft, L 230/12 ft:
    // 3000 × 36 / (12 × 19.1667) = 469.565 ft·lb per inch.
    const c = ledgerCondition({ ...boat, mct1FtLbPerIn: 480 }, [{ id: "x", weightLb: 150, aftOfBowIn: 174, offCentreIn: 0 }]);
    expect(c.trim?.mct1FtLbPerIn).toBeCloseTo(469.565, 3);
  });
});
