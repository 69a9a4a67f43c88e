// Geometry of the heel and plan drawings: the hull turns by the computed angle, starboard side down
// for a starboard heel, the waterline stays level, and the weights turn with the hull.
import { describe, expect, it } from "vitest";
import { deckHalfBreadth, heelPoint, HEIGHT_DATUM_Y_IN, planGeometry, sectionGeometry } from "~/domain/boat-drawing";

describe("the section looking forward", () => {
  it("turns a point by the heel: starboard down for + (a rotation keeps its distance from the centre)", () => {
    const p = heelPoint({ x: 47, y: 0 }, 10);
    // By hand: x' = 47 cos 10° = 46.286, y' = −47 sin 10° = −8.161
    expect(p.x).toBeCloseTo(46.286, 3);
    expect(p.y).toBeCloseTo(-8.161, 3);
    expect(Math.hypot(p.x, p.y)).toBeCloseTo(47, 10);
    expect(heelPoint({ x: -47, y: 0 }, 10).y).toBeCloseTo(8.161, 3);
  });

  it("upright, the hull is symmetric about the centreline and crosses the waterline at the same half-breadth each side", () => {
    const g = sectionGeometry({ beamIn: 94, heelDeg: 0, weights: [] });
    const xs = g.hull.map((p) => p.x);
    expect(Math.max(...xs)).toBeCloseTo(47, 10);
    expect(Math.min(...xs)).toBeCloseTo(-47, 10);
    const atWaterline = g.hull.filter((p) => p.y === 0).map((p) => p.x).sort((a, b) => a - b);
    expect(atWaterline).toEqual([-43, 43]);
    expect(g.waterline[0].y).toBe(0);
    expect(g.waterline[1].y).toBe(0);
  });

  it("heeled to starboard, the starboard sheer goes down, the keel swings to port, the mast leans to starboard", () => {
    const upright = sectionGeometry({ beamIn: 94, heelDeg: 0, weights: [] });
    const heeled = sectionGeometry({ beamIn: 94, heelDeg: 5, weights: [] });
    // Every point of the outline is the upright one turned by 5°.
    heeled.hull.forEach((p, i) => expect(p).toMatchObject(heelPoint(upright.hull[i], 5)));
    // The sheer (46.5 in out, 24 in up on the 94 in beam): starboard goes down, port comes up.
    expect(heelPoint({ x: 46.5, y: 24 }, 5).y).toBeLessThan(24);
    expect(heelPoint({ x: -46.5, y: 24 }, 5).y).toBeGreaterThan(24);
    const keel = heeled.hull.reduce((low, p) => (p.y < low.y ? p : low));
    expect(keel.x).toBeLessThan(0);
    expect(heeled.mast[1].x).toBeGreaterThan(0);
    // The mast leans by the heel: atan(dx/dy) = 5°
    const dx = heeled.mast[1].x - heeled.mast[0].x;
    const dy = heeled.mast[1].y - heeled.mast[0].y;
    expect((Math.atan2(dx, dy) * 180) / Math.PI).toBeCloseTo(5, 10);
    expect(heeled.waterline[0].y).toBe(0);
  });

  it("places a weight by its offset and height, and turns it with the hull", () => {
    const w = { id: "b", label: "1", offCentreIn: 25, heightIn: 14, weightLb: 62 };
    const upright = sectionGeometry({ beamIn: 94, heelDeg: 0, weights: [w] }).weights[0];
    expect(upright.x).toBe(25);
    expect(upright.y).toBe(HEIGHT_DATUM_Y_IN + 14);
    const heeled = sectionGeometry({ beamIn: 94, heelDeg: 3, weights: [w] }).weights[0];
    expect(heeled).toMatchObject(heelPoint({ x: 25, y: HEIGHT_DATUM_Y_IN + 14 }, 3));
    // A heavier weight is drawn larger.
    const light = sectionGeometry({ beamIn: 94, heelDeg: 0, weights: [{ ...w, weightLb: 10 }] }).weights[0];
    expect(light.r).toBeLessThan(upright.r);
  });
});

describe("the plan view", () => {
  it("is widest (the beam) a little aft of midships, narrows to the transom and the bow", () => {
    expect(deckHalfBreadth(0, 94)).toBe(0);
    expect(deckHalfBreadth(0.55, 94)).toBeCloseTo(47, 10);
    expect(deckHalfBreadth(1, 94)).toBeCloseTo(47 * 0.72, 10);
    const g = planGeometry({ loaIn: 264, beamIn: 94, waterlineForwardEndIn: 12, lwlIn: 230, lcfIn: 150, weights: [{ id: "o", label: "1", aftOfBowIn: 270, offCentreIn: -14, weightLb: 58 }] });
    expect(Math.max(...g.deck.map((p) => p.y))).toBeLessThanOrEqual(47 + 1e-9);
    expect(g.waterlineEnds).toEqual([12, 242]);
    expect(g.weights[0]).toMatchObject({ x: 270, y: -14 });
    expect(g.bounds.maxX).toBeGreaterThan(270); // an outboard on its bracket is drawn past the transom
  });
});
