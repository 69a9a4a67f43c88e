// GET /api/heel and GET /api/cable, as parsed and answered by app/domain/tool-params.ts.
import { describe, expect, it } from "vitest";
import { NEC_CH9_TABLE8 } from "~/domain/conductors";
import { cableAnswer, heelAnswer, parseCableParams, parseHeelParams } from "~/domain/tool-params";

const q = (s: string) => new URLSearchParams(s);

describe("heel (Nicholls, Seamanship and Nautical Knowledge, p. 532 and around)", () => {
  it("100 t moved 30 ft, W 9000 t, GM 2.3718 ft: heel 8.0 degrees", () => {
    const p = parseHeelParams(q("displacement=9000&gm=2.3718&weight=100&distance=30"));
    if (!p.ok) throw new Error(p.message);
    expect((heelAnswer(p) as { heelDegrees: number }).heelDegrees).toBeCloseTo(8.0, 3);
  });

  it("with heel=8 in place of gm: GM 2.37 ft (2.3718)", () => {
    const p = parseHeelParams(q("displacement=9000&heel=8&weight=100&distance=30"));
    if (!p.ok) throw new Error(p.message);
    expect(heelAnswer(p)).toEqual({ gm: 2.3718 });
  });

  it("a move to port (negative distance) heels to port", () => {
    const p = parseHeelParams(q("displacement=9000&gm=2.3718&weight=100&distance=-30"));
    if (!p.ok) throw new Error(p.message);
    expect((heelAnswer(p) as { heelDegrees: number }).heelDegrees).toBeCloseTo(-8.0, 3);
  });

  it("names the parameter that is wrong", () => {
    const cases: [string, string][] = [
      ["gm=2.8&weight=62&distance=51", "displacement"],
      ["displacement=abc&gm=2.8&weight=62&distance=51", "displacement"],
      ["displacement=0&gm=2.8&weight=62&distance=51", "displacement"],
      ["displacement=3300&gm=2.8&distance=51", "weight"],
      ["displacement=3300&gm=2.8&weight=-62&distance=51", "weight"],
      ["displacement=3300&gm=2.8&weight=62", "distance"],
      ["displacement=3300&gm=2.8&weight=62&distance=5 1", "distance"],
      ["displacement=3300&weight=62&distance=51", "gm"],
      ["displacement=3300&gm=0&weight=62&distance=51", "gm"],
      ["displacement=3300&gm=2.8&heel=1.6&weight=62&distance=51", "heel"],
      ["displacement=3300&heel=0&weight=62&distance=51", "heel"],
      ["displacement=3300&heel=50&weight=62&distance=51", "heel"],
      ["displacement=3300&heel=1.6&weight=62&distance=0", "distance"],
      ["displacement=1e3&gm=2.8&weight=62&distance=51", "displacement"],
    ];
    for (const [query, parameter] of cases) {
      const p = parseHeelParams(q(query));
      expect(p.ok, query).toBe(false);
      if (!p.ok) {
        expect(p.parameter, query).toBe(parameter);
        expect(p.message).toMatch(new RegExp(`^${parameter}: `));
      }
    }
  });
});

describe("cable (ABYC E-11 as reproduced; NEC Ch. 9 Table 8; 33 CFR 183.425 Table 5, 183.455(c))", () => {
  function answer(query: string) {
    const p = parseCableParams(q(query));
    if (!p.ok) throw new Error(p.message);
    return cableAnswer(p.input);
  }

  it("worked example: 10 A, 10.5 ft one way (21 ft round trip), 3 % of 12 V → CM 6,270.8; Table 8 resistance needs 10 AWG", () => {
    const { status, body } = answer("current=10&length=10.5&voltage=12&drop=3&insulation=105");
    expect(status).toBe(200);
    if ("error" in body) throw new Error(body.message);
    expect(body.circularMils).toBe(6270.8); // ABYC E-11: 10.75 × 10 × 21 / 0.36
    // 12 AWG (6,530 CM) meets the area, but 1.98 Ω/kft × 21 ft × 10 A = 0.416 V > 0.36 V; 10 AWG: 0.260 V.
    expect(body.awgByDrop).toBe("10");
    expect(body.dropGovernedBy).toBe("resistance");
    expect(body.awgByAmpacity).toBe("16"); // Table 5, 105 °C: 16 AWG carries 25 A
    expect(body.awg).toBe("10");
    expect(body.dropPercent).toBeCloseTo((10 * NEC_CH9_TABLE8["10"].ohmsPerKft * 21) / 1000 / 12 * 100, 2); // 2.17 %
    expect(body.maxOvercurrentAmps).toBe(90); // 150 % of 60 A (10 AWG, 105 °C, Table 5)
  });

  it("ampacity governs a short heavy run; inside an engine space the 105 °C engine column applies", () => {
    // Table 5: 60 A at 105 °C outside engine spaces → 10 AWG (60 A); inside → 8 AWG (68 A; 10 AWG only 51 A).
    const outside = answer("current=60&length=1&voltage=12&drop=10&insulation=105&engineSpace=false").body;
    const inside = answer("current=60&length=1&voltage=12&drop=10&insulation=105&engineSpace=true").body;
    if ("error" in outside || "error" in inside) throw new Error("no size");
    expect(outside.awgByAmpacity).toBe("10");
    expect(outside.governedBy).toBe("ampacity");
    expect(inside.awgByAmpacity).toBe("8");
    expect(inside.maxOvercurrentAmps).toBe(102); // 150 % of 68 A
  });

  it("10 % allowed for other loads gives a smaller conductor than 3 % (ABYC E-11 as reproduced)", () => {
    const three = answer("current=10&length=20&voltage=12&drop=3&insulation=75").body;
    const ten = answer("current=10&length=20&voltage=12&drop=10&insulation=75").body;
    if ("error" in three || "error" in ten) throw new Error("no size");
    // CM: 10.75 × 10 × 40 / 0.36 = 11,944 (8 AWG) against / 1.2 = 3,583 (14 AWG)
    expect(three.circularMils).toBeCloseTo(11944.4, 1);
    expect(ten.circularMils).toBeCloseTo(3583.3, 1);
    expect(three.awgByDrop).toBe("8");
    expect(ten.awgByDrop).toBe("12"); // 14 AWG: 3.14 × 40 × 10 / 1000 = 1.256 V > 1.2 V
  });

  it("answers 422 when no listed conductor is large enough", () => {
    const { status, body } = answer("current=200&length=30&voltage=12&drop=3&insulation=60");
    expect(status).toBe(422);
    expect(body).toMatchObject({ error: "nothing-large-enough" });
  });

  it("names the parameter that is wrong", () => {
    const good = { current: "30", length: "11", voltage: "12", drop: "3", insulation: "105" };
    const cases: [Record<string, string>, string][] = [
      [{ current: "" }, "current"],
      [{ current: "thirty" }, "current"],
      [{ current: "0" }, "current"],
      [{ length: "-11" }, "length"],
      [{ voltage: "36" }, "voltage"],
      [{ drop: "5" }, "drop"],
      [{ insulation: "80" }, "insulation"],
      [{ engineSpace: "maybe" }, "engineSpace"],
      [{ insulation: "90", engineSpace: "true" }, "insulation"],
    ];
    for (const [change, parameter] of cases) {
      const params = new URLSearchParams({ ...good, ...change });
      if (change.current === "") params.delete("current");
      const p = parseCableParams(params);
      expect(p.ok, JSON.stringify(change)).toBe(false);
      if (!p.ok) expect(p.parameter).toBe(parameter);
    }
  });
});
