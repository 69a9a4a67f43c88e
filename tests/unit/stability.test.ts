import { describe, expect, it } from "vitest";
import {
  SMALL_ANGLE_LIMIT_DEG,
  STABILITY_CAUTIONS,
  calibrateGm,
  gmFromInclining,
  gzSmallAngle,
  heelFromMoment,
  heelSide,
  ledgerCondition,
  levelByAdding,
  levelByMoving,
  mct1,
  momentForHeel,
  rightingMoment,
  shiftToLevel,
  splitTrim,
  tanHeel,
  trimChangeIn,
  weightToLevel,
  whatIfMove,
  type BoatParticulars,
  type LedgerItem,
} from "~/domain/stability";

// Published worked examples: Nicholls's Seamanship and Nautical Knowledge, p. 532 and around.
// The core functions are unit-agnostic, so these run in long tons and feet as printed.

describe("inclining relation (Nicholls)", () => {
  it("100 t moved 30 ft heels a 9000 t ship 8 degrees: GM 2.37 ft", () => {
    // Nicholls: GM = w·d / (W·tan θ) = 100 × 30 / (9000 × tan 8°) = 2.3718 ft
    const gm = gmFromInclining({ weight: 100, distance: 30, displacement: 9000, heel: { degrees: 8 } });
    expect(gm).toBeCloseTo(2.3718, 4);
  });

  it("reversed: the same moment with GM 2.3718 ft gives 8.0 degrees", () => {
    // Nicholls: θ = atan(100 × 30 / (9000 × 2.3718)) = 8.0°
    expect(heelFromMoment(100 * 30, 9000, 2.3718)).toBeCloseTo(8.0, 3);
  });

  it("3 t moved 40 ft, W 2600 t, plumb line 29 ft 6 in deflecting 2 in: GM 8.17 ft", () => {
    // Nicholls: tan θ = 2 in / 29 ft 6 in; GM = 3 × 40 / (2600 × tan θ) = 8.17 ft
    const inFeet = gmFromInclining({
      weight: 3,
      distance: 40,
      displacement: 2600,
      heel: { deflection: 2 / 12, plumbLength: 29.5 },
    });
    expect(inFeet).toBeCloseTo(8.17, 2);
    // Same observation with the plumb line in inches (deflection and length share a unit).
    const inInches = gmFromInclining({
      weight: 3,
      distance: 40,
      displacement: 2600,
      heel: { deflection: 2, plumbLength: 29 * 12 + 6 },
    });
    expect(inInches).toBeCloseTo(inFeet, 10);
  });

  it("the ledger's calibration converts the shift from inches (Nicholls plumb example)", () => {
    // Nicholls: 3 t moved 40 ft (480 in), W 2600 t, plumb 354 in deflecting 2 in → GM 8.17 ft.
    // The weight unit cancels, so tons stand in for pounds here.
    const gmFt = calibrateGm({
      weightLb: 3,
      shiftIn: 40 * 12,
      displacementLb: 2600,
      heel: { deflection: 2, plumbLength: 354 },
    });
    expect(gmFt).toBeCloseTo(8.17, 2);
  });

  it("momentForHeel is the inverse of heelFromMoment (Nicholls 8° example)", () => {
    // Nicholls: 100 t × 30 ft = 3000 ft-t holds 8° at W 9000 t, GM 2.3718 ft
    expect(momentForHeel(8, 9000, 2.3718)).toBeCloseTo(3000, 0);
  });

  it("tan θ of a plumb line is deflection over length (ASTM F1321)", () => {
    // ASTM F1321 inclining: tan θ = deflection / pendulum length; 2 in over 354 in
    expect(tanHeel({ deflection: 2, plumbLength: 354 })).toBeCloseTo(2 / 354, 12);
  });

  it("rejects a zero heel and non-positive displacement or GM", () => {
    expect(() =>
      gmFromInclining({ weight: 1, distance: 1, displacement: 100, heel: { degrees: 0 } }),
    ).toThrow(RangeError);
    expect(() => heelFromMoment(10, 0, 2)).toThrow(RangeError);
    expect(() => heelFromMoment(10, 100, -1)).toThrow(RangeError);
  });
});

describe("righting lever (Nicholls)", () => {
  it("KM 16 ft, KG 13.8 ft, W 6000 t, 8 degrees: GZ 0.306 ft, righting moment 1837 ft-t", () => {
    // Nicholls: GM = KM − KG = 2.2 ft; GZ = GM sin θ = 0.306 ft; RM = W·GZ = 1837 ft-t
    const gm = 16 - 13.8;
    expect(gzSmallAngle(gm, 8)).toBeCloseTo(0.306, 3);
    expect(rightingMoment(6000, gm, 8)).toBeCloseTo(1837, 0);
  });
});

describe("trim (Nicholls)", () => {
  it("MCT1 480 ft-t, 40 t moved 36 ft: trim changes 3 in", () => {
    // Nicholls: change of trim = 40 × 36 / 480 = 3 in
    expect(trimChangeIn(40 * 36, 480)).toBeCloseTo(3, 10);
  });

  it("MCT1 = W·GM_L / (12·L)", () => {
    // Nicholls: MCT 1 in = W GM_L / (12 L). Hand: 3000 × 23 / (12 × 230/12) = 69000 / 230 = 300
    expect(mct1(3000, 23, 230 / 12)).toBeCloseTo(300, 10);
  });

  it("splits the trim about the LCF: bow change = trim × (LCF from forward end) / L", () => {
    // Pivot about the LCF (any naval architecture text). Hand: 1 in by the stern,
    // LCF 138 in from the forward end of a 230 in waterline: bow −1 × 138/230 = −0.6 in,
    // stern +1 × 92/230 = +0.4 in.
    const { bowChangeIn, sternChangeIn } = splitTrim(1, 138, 230);
    expect(bowChangeIn).toBeCloseTo(-0.6, 10);
    expect(sternChangeIn).toBeCloseTo(0.4, 10);
    // By the bow: the signs flip.
    const byBow = splitTrim(-1, 138, 230);
    expect(byBow.bowChangeIn).toBeCloseTo(0.6, 10);
    expect(byBow.sternChangeIn).toBeCloseTo(-0.4, 10);
  });
});

describe("inverse: bring the heel to zero (Nicholls 8° example)", () => {
  it("the 100 t weight must go back 30 ft", () => {
    // Nicholls: the list came from 100 t moved 30 ft; moving it back cancels the 3000 ft-t
    expect(shiftToLevel(100 * 30, 100)).toBeCloseTo(-30, 10);
  });

  it("the weight at a given offset that cancels the moment", () => {
    // w = M / y: 3000 ft-t cancelled at 20 ft on the other side takes 150 t
    expect(weightToLevel(3000, -20)).toBeCloseTo(150, 10);
    // On the side the ship already lists to, no weight can help.
    expect(weightToLevel(3000, 20)).toBeNull();
    expect(weightToLevel(3000, 0)).toBeNull();
  });
});

// Brantwater 22: invented demo data (Δ 2,850 lb light, GM 2.8 ft, LWL 19 ft 2 in, beam 7 ft 10 in).
// Checked against the formulas above, not against a source.
const brantwater: BoatParticulars = {
  lightDisplacementLb: 2850,
  gmFt: 2.8,
  lwlFt: 19 + 2 / 12,
  lcfAftOfBowIn: 150, // invented demo value
  waterlineForwardEndAftOfBowIn: 12, // invented demo value
  beamFt: 7 + 10 / 12,
};

describe("ledger: Brantwater 22 demo (invented data, checked by hand against the formula)", () => {
  const battery: LedgerItem = { id: "battery", weightLb: 58, aftOfBowIn: 150, offCentreIn: 0, heightIn: 10 };

  it("a 58 lb battery moved 44 in across from the centreline heels her about 1.5 degrees", () => {
    // By hand: Δ = 2850 + 58 = 2908 lb (light displacement + ledger weights).
    // M = 58 lb × 44 in / 12 = 212.667 ft·lb. Δ·GM = 2908 × 2.8 = 8142.4 ft·lb.
    // tan θ = 212.667 / 8142.4 = 0.026118; θ = 1.496°, starboard side down.
    const { before, after, withinBeam } = whatIfMove(brantwater, [battery], "battery", { offCentreIn: 44 });
    expect(before.heelDeg).toBeCloseTo(0, 10);
    expect(before.heelSide).toBe("upright");
    expect(after.displacementLb).toBe(2908);
    expect(after.transverseMomentFtLb).toBeCloseTo(212.667, 3);
    expect(after.heelDeg).toBeCloseTo(1.496, 3);
    expect(after.heelSide).toBe("starboard");
    expect(after.withinSmallAngleRange).toBe(true);
    // 44 in off the centreline is inside the 47 in half-beam.
    expect(withinBeam).toBe(true);
  });

  it("moved from 22 in port to 22 in starboard: the heel goes from −0.748 to +0.748 degrees", () => {
    // By hand: ±58 × 22 / 12 = ±106.333 ft·lb; tan θ = ±106.333 / 8142.4 = ±0.013059; θ = ±0.748°
    const port = { ...battery, offCentreIn: -22 };
    const { before, after } = whatIfMove(brantwater, [port], "battery", { offCentreIn: 22 });
    expect(before.heelDeg).toBeCloseTo(-0.748, 3);
    expect(before.heelSide).toBe("port");
    expect(after.heelDeg).toBeCloseTo(0.748, 3);
  });

  it("raising the battery 20 in while moving it lowers GM by w·Δh/Δ", () => {
    // Shift of G, GG₁ = w·d/Δ (common practice). By hand: 58 × (20/12) / 2908 = 0.033242 ft;
    // GM 2.8 → 2.766758 ft; tan θ = 212.667 / (2908 × 2.766758) = 0.026432; θ = 1.514°
    const { after } = whatIfMove(brantwater, [battery], "battery", { offCentreIn: 44, heightIn: 30 });
    expect(after.gmFt).toBeCloseTo(2.766758, 6);
    expect(after.heelDeg).toBeCloseTo(1.514, 3);
  });

  it("flags a position outside the half-beam", () => {
    // Half-beam of 7 ft 10 in = 47 in (invented demo particular)
    const { withinBeam } = whatIfMove(brantwater, [battery], "battery", { offCentreIn: 50 });
    expect(withinBeam).toBe(false);
  });

  it("marks a heel past the small-angle limit", () => {
    // By hand: 500 lb at 60 in → 2500 ft·lb; Δ = 3350 lb; tan θ = 2500 / (3350 × 2.8) = 0.26652;
    // θ = 14.9°, beyond the ~10° limit of initial stability (common practice)
    const condition = ledgerCondition(brantwater, [{ id: "x", weightLb: 500, aftOfBowIn: 150, offCentreIn: 60 }]);
    expect(condition.heelDeg).toBeCloseTo(14.92, 2);
    expect(condition.heelDeg).toBeGreaterThan(SMALL_ANGLE_LIMIT_DEG);
    expect(condition.withinSmallAngleRange).toBe(false);
    expect(STABILITY_CAUTIONS.join(" ")).toMatch(/estimate/);
  });

  it("computes no trim without GM_L", () => {
    expect(ledgerCondition(brantwater, [battery]).trim).toBeNull();
  });

  it("trims by the stern for weight aft of the LCF, split about the LCF", () => {
    // Invented GM_L 23 ft. By hand: Δ = 2850 + 150 = 3000 lb;
    // MCT1 = 3000 × 23 / (12 × 230/12) = 300 ft·lb/in. Item 24 in aft of the LCF:
    // M = 150 × 24 / 12 = 300 ft·lb → 1 in by the stern. LCF 150 − 12 = 138 in from the
    // forward end of the 230 in waterline: bow −0.6 in, stern +0.4 in.
    const particulars = { ...brantwater, gmLongitudinalFt: 23 };
    const condition = ledgerCondition(particulars, [{ id: "tank", weightLb: 150, aftOfBowIn: 174, offCentreIn: 0 }]);
    expect(condition.longitudinalMomentFtLb).toBeCloseTo(300, 10);
    expect(condition.trim?.mct1FtLbPerIn).toBeCloseTo(300, 10);
    expect(condition.trim?.changeIn).toBeCloseTo(1, 10);
    expect(condition.trim?.sense).toBe("by the stern");
    expect(condition.trim?.bowChangeIn).toBeCloseTo(-0.6, 10);
    expect(condition.trim?.sternChangeIn).toBeCloseTo(0.4, 10);
  });

  it("trims by the bow for weight forward of the LCF", () => {
    // By hand: 150 lb 24 in forward of the LCF → −300 ft·lb → 1 in by the bow
    const particulars = { ...brantwater, gmLongitudinalFt: 23 };
    const condition = ledgerCondition(particulars, [{ id: "anchor", weightLb: 150, aftOfBowIn: 126, offCentreIn: 0 }]);
    expect(condition.trim?.changeIn).toBeCloseTo(-1, 10);
    expect(condition.trim?.sense).toBe("by the bow");
    expect(condition.trim?.bowChangeIn).toBeCloseTo(0.6, 10);
  });

  describe("levelling", () => {
    const items: LedgerItem[] = [
      { id: "battery", weightLb: 58, aftOfBowIn: 150, offCentreIn: 22 },
      { id: "water", weightLb: 120, aftOfBowIn: 100, offCentreIn: -10 },
    ];

    it("moves the battery 76/58 in to port to level her", () => {
      // By hand: Σ w·y = 58 × 22 − 120 × 10 = 76 in·lb to starboard; shift = −76 / 58 = −1.3103 in
      const { shiftIn, newOffCentreIn, withinBeam } = levelByMoving(brantwater, items, "battery");
      expect(shiftIn).toBeCloseTo(-1.3103, 4);
      expect(newOffCentreIn).toBeCloseTo(20.6897, 4);
      expect(withinBeam).toBe(true);
      const levelled = items.map((i) => (i.id === "battery" ? { ...i, offCentreIn: newOffCentreIn } : i));
      expect(ledgerCondition(brantwater, levelled).heelDeg).toBeCloseTo(0, 10);
      expect(heelSide(ledgerCondition(brantwater, levelled).heelDeg)).toBe("upright");
    });

    it("adds 76/30 lb at 30 in to port, and nothing on the starboard side can", () => {
      // By hand: w = 76 in·lb / 30 in = 2.5333 lb
      expect(levelByAdding(items, -30)).toBeCloseTo(2.5333, 4);
      expect(levelByAdding(items, 30)).toBeNull();
    });

    it("throws for an unknown item", () => {
      expect(() => levelByMoving(brantwater, items, "nope")).toThrow(RangeError);
    });
  });
});
