/**
 * The query parameters of GET /api/heel and GET /api/cable (README, "API"): read, checked, and
 * answered as JSON. A wrong parameter gives { ok: false, parameter, message } naming it.
 */
import { sizeCableRun, type CableRunInput, type SystemVoltage } from "./cable";
import { INSULATION_RATINGS_C, type AllowedDropPct, type Awg, type InsulationRatingC } from "./conductors";
import { gmFromInclining, heelFromMoment } from "./stability";

export type ParamProblem = { ok: false; parameter: string; message: string };

function problem(parameter: string, message: string): ParamProblem {
  return { ok: false, parameter, message: `${parameter}: ${message}` };
}

type Num = { ok: true; value: number } | ParamProblem;

/** A plain decimal number ("2850", "2.8", "-30", "1e3" is refused: write the digits). */
function readNumber(q: URLSearchParams, name: string, opts: { positive?: boolean; signed?: boolean } = {}): Num | null {
  const raw = q.get(name);
  if (raw === null || raw.trim() === "") return null;
  const text = raw.trim();
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(text)) return problem(name, `"${raw}" is not a number; write it with digits and a decimal point, e.g. 2.8.`);
  const value = Number(text);
  if (!Number.isFinite(value)) return problem(name, "the number is too large.");
  if (opts.positive && !(value > 0)) return problem(name, "must be more than zero.");
  if (!opts.signed && value < 0) return problem(name, "must not be negative.");
  return { ok: true, value };
}

function required(q: URLSearchParams, name: string, opts: { positive?: boolean; signed?: boolean } = {}): Num {
  return readNumber(q, name, opts) ?? problem(name, "is required.");
}

// ---------------------------------------------------------------------------------------------
// GET /api/heel

export type HeelQuery =
  | { ok: true; find: "heel"; displacement: number; gm: number; weight: number; distance: number }
  | { ok: true; find: "gm"; displacement: number; heel: number; weight: number; distance: number };

/**
 * displacement, weight (one weight unit), distance and gm (one length unit); or heel (degrees)
 * in place of gm. The distance may be signed (+ to starboard); the heel's sign follows it.
 */
export function parseHeelParams(q: URLSearchParams): HeelQuery | ParamProblem {
  const displacement = required(q, "displacement", { positive: true });
  if (!displacement.ok) return displacement;
  const weight = required(q, "weight", { positive: true });
  if (!weight.ok) return weight;
  const distance = required(q, "distance", { signed: true });
  if (!distance.ok) return distance;
  const gm = readNumber(q, "gm", { positive: true });
  const heel = readNumber(q, "heel", { signed: true });
  if (gm && heel) return problem("heel", "give gm or heel, not both: with gm the answer is the heel, with heel it is the GM.");
  if (gm) {
    if (!gm.ok) return gm;
    return { ok: true, find: "heel", displacement: displacement.value, gm: gm.value, weight: weight.value, distance: distance.value };
  }
  if (heel) {
    if (!heel.ok) return heel;
    if (heel.value === 0) return problem("heel", "must not be zero: a GM cannot be worked out from no list.");
    if (Math.abs(heel.value) >= 45) return problem("heel", "must be under 45 degrees; the inclining relation holds only for small angles.");
    if (distance.value === 0) return problem("distance", "must not be zero when the GM is worked out from a heel.");
    return { ok: true, find: "gm", displacement: displacement.value, heel: heel.value, weight: weight.value, distance: distance.value };
  }
  return problem("gm", "is required (or give heel, in degrees, to work out the GM).");
}

export type HeelAnswer = { heelDegrees: number } | { gm: number };

/** θ = atan(w·d / (Δ·GM)); or GM = w·d / (Δ·tan θ) (ASTM F1321). Rounded to 4 decimals. */
export function heelAnswer(h: HeelQuery): HeelAnswer {
  const round = (x: number) => Math.round(x * 1e4) / 1e4;
  if (h.find === "heel") return { heelDegrees: round(heelFromMoment(h.weight * h.distance, h.displacement, h.gm)) };
  // A heel to the side the weight went gives a positive GM; the signs are the caller's to match.
  return {
    gm: round(Math.abs(gmFromInclining({ weight: h.weight, distance: h.distance, displacement: h.displacement, heel: { degrees: h.heel } }))),
  };
}

// ---------------------------------------------------------------------------------------------
// GET /api/cable

export type CableQuery = { ok: true; input: CableRunInput };

export function parseCableParams(q: URLSearchParams): CableQuery | ParamProblem {
  const current = required(q, "current", { positive: true });
  if (!current.ok) return current;
  const length = required(q, "length", { positive: true });
  if (!length.ok) return length;
  const voltage = required(q, "voltage");
  if (!voltage.ok) return voltage;
  if (voltage.value !== 12 && voltage.value !== 24) return problem("voltage", "must be 12 or 24 (volts).");
  const drop = required(q, "drop");
  if (!drop.ok) return drop;
  if (drop.value !== 3 && drop.value !== 10) {
    return problem("drop", "must be 3 (feeders, bilge blowers, electronics, navigation lights) or 10 (other loads), in percent.");
  }
  const insulation = required(q, "insulation");
  if (!insulation.ok) return insulation;
  if (!(INSULATION_RATINGS_C as number[]).includes(insulation.value)) return problem("insulation", "must be 60, 75, 90 or 105 (degrees C).");
  const engineRaw = (q.get("engineSpace") ?? "").trim().toLowerCase();
  if (!["", "true", "false", "1", "0", "yes", "no"].includes(engineRaw)) return problem("engineSpace", "must be true or false.");
  const inEngineSpace = ["true", "1", "yes"].includes(engineRaw);
  if (inEngineSpace && insulation.value !== 105) {
    return problem("insulation", "inside an engine space only 105 °C insulation is sized (33 CFR 183.425 Table 5).");
  }
  return {
    ok: true,
    input: {
      currentA: current.value,
      oneWayLengthFt: length.value,
      systemVoltage: voltage.value as SystemVoltage,
      allowedDropPct: drop.value as AllowedDropPct,
      insulationRatingC: insulation.value as InsulationRatingC,
      inEngineSpace,
    },
  };
}

export type CableAnswer =
  | {
      circularMils: number;
      awgByDrop: Awg;
      awgByAmpacity: Awg;
      awg: Awg;
      dropPercent: number;
      maxOvercurrentAmps: number;
      dropGovernedBy: string;
      governedBy: string;
      sizedAgainst: string;
    }
  | { error: "nothing-large-enough"; message: string; circularMils: number | null };

export function cableAnswer(input: CableRunInput): { status: 200 | 422; body: CableAnswer } {
  const r = sizeCableRun(input);
  if (!r.ok) {
    return { status: 422, body: { error: "nothing-large-enough", message: r.message, circularMils: r.requiredCircularMils === undefined ? null : Math.round(r.requiredCircularMils * 10) / 10 } };
  }
  return {
    status: 200,
    body: {
      circularMils: Math.round(r.requiredCircularMils * 10) / 10,
      awgByDrop: r.dropSize,
      awgByAmpacity: r.ampacitySize,
      awg: r.chosen,
      dropPercent: Math.round(r.actualDropPct * 100) / 100,
      maxOvercurrentAmps: r.maxOvercurrentA,
      dropGovernedBy: r.dropGovernedBy,
      governedBy: r.governedBy,
      sizedAgainst: r.sizedAgainst,
    },
  };
}
