/**
 * The fit check across the class's spaces: what the spaces look like to the fit, the bounds of
 * the database's candidate filter, the words for an orientation, and the reading of the fit
 * API's parameters. Pure: the queries are in app/models/spaces.server.ts.
 *
 * Which box the fit uses for a space (docs/decisions/0002-consensus-and-sections.md and
 * 0010-measurements-of-every-section.md): members measure any of its sections; where a section
 * has measurements, their consensus (median, dimension by dimension) replaces its described size;
 * the sections nobody measured keep theirs.
 */
import { consensusBySection, type SectionMeasurement } from "./consensus";
import { isUpright, sortedDims, VERDICT_TEXT, type Opening, type Orientation, type Placement, type RowPlacement } from "./fit";
import { LAST_HULL, FIRST_HULL } from "./hulls";
import { formatLength, mmToInches, parseDimensions, parseLength, type Box, type LengthUnit } from "./units";

/** Faces of an opening as recorded; the fit tells only a lid (top) from a door (any side). */
export type RecordedFace = "top" | "front" | "side" | "end";

export function fitOpening(
  width: number | null,
  height: number | null,
  face: RecordedFace | null,
): Opening | undefined {
  if (width === null || height === null) return undefined;
  return { width, height, face: face === "top" ? "top" : "front" };
}

/**
 * The sections the fit uses: each section takes the consensus of its own measurements where
 * there are any; the others are as described. A plain box is a measurement of the main section.
 */
export function fitSections(described: readonly Box[], measurements: readonly (Box | SectionMeasurement)[]): Box[] {
  const { bySection } = consensusBySection(measurements.map((m) => ("section" in m ? m : { section: 0, box: m })));
  return described.map((box, i) => {
    const c = bySection.get(i);
    return c ? { length: c.length.consensus, width: c.width.consensus, height: c.height.consensus } : { ...box };
  });
}

/**
 * Allowance for rounding in the database's filter: it may let through a section a thousandth
 * of a millimetre too small (the exact check then turns it away), never drop one that fits.
 */
export const CANDIDATE_SLACK_MM = 0.001;

/**
 * The lowest corner of the region of the index space (sorted dimensions, see `sortedDims`)
 * in which a section can take the item: each sorted dimension plus twice the clearance, less
 * the slack. A section is a candidate when its sorted dimensions are all at least these.
 * The criterion is the box-nesting test (Cormen et al., Introduction to Algorithms, 3rd ed.,
 * Problem 24-2).
 */
export function candidateCorner(item: Box, orientation: Orientation, clearanceMm: number): [number, number, number] {
  return sortedDims(item, orientation).map((d) => d + 2 * clearanceMm - CANDIDATE_SLACK_MM) as [number, number, number];
}

export interface CandidateRegions {
  /** Which sorted form of the sections to search: "any" (largest first) or "upright"
   * (footprint larger side first, then the height); see `sortedDims`. */
  index: Orientation;
  /** Lowest corners: a section is a candidate when it lies beyond any one of them. */
  corners: [number, number, number][];
}

/**
 * Where to look for sections that take the item, or `count` of them in a row.
 *
 * One item: one region, in the index of its orientation (`candidateCorner`).
 *
 * A row is itself a box: one of the item's dimensions d becomes n·d + (n − 1)·c (the gaps
 * between neighbours), with the clearance all round as for one item, and it must lie level. So
 * rows are searched in the upright index, one region for each way the row can stand: upright,
 * along either side of the footprint; any way up, each dimension of the item standing up and
 * each of the other two along the row. A section takes some row exactly when it lies beyond one
 * of these corners (the exact check then picks the row).
 */
export function candidateRegions(item: Box, orientation: Orientation, clearanceMm: number, count = 1): CandidateRegions {
  if (count === 1) return { index: orientation, corners: [candidateCorner(item, orientation, clearanceMm)] };
  const dims = [item.length, item.width, item.height];
  const rows: Box[] = [];
  const row = (along: number, across: number, up: number) =>
    rows.push({ length: count * along + (count - 1) * clearanceMm, width: across, height: up });
  if (orientation === "upright") {
    row(item.length, item.width, item.height);
    row(item.width, item.length, item.height);
  } else {
    for (let up = 0; up < 3; up++) {
      const [a, b] = dims.filter((_, i) => i !== up);
      row(a, b, dims[up]);
      row(b, a, dims[up]);
    }
  }
  const corners = rows.map((box) => candidateCorner(box, "upright", clearanceMm));
  return {
    index: "upright",
    corners: corners.filter((c, i) => corners.findIndex((d) => d.every((v, k) => v === c[k])) === i),
  };
}

/**
 * The least opening that can pass the item (see `passesOpening` in fit.ts), less the slack, for
 * the database's filter: "any": the opening's shorter side at least `small` and its longer side
 * at least `large`; "upright", a lid on top: the same with the footprint; "upright", a door in a
 * side: its width at least `small` (the narrower footprint side) and its height at least `up`.
 */
export function openingBounds(item: Box, orientation: Orientation, clearanceMm: number) {
  const add = (d: number) => d + 2 * clearanceMm - CANDIDATE_SLACK_MM;
  if (orientation === "any") {
    const [a, b] = [item.length, item.width, item.height].sort((x, y) => x - y);
    return { small: add(a), large: add(b), up: null };
  }
  return {
    small: add(Math.min(item.length, item.width)),
    large: add(Math.max(item.length, item.width)),
    up: add(item.height),
  };
}

const AXIS_WORD: Record<keyof Box, string> = { length: "length", width: "width", height: "height" };

/**
 * An orientation in words, in the space's terms (length fore and aft, width athwartships):
 * "Upright, length fore and aft", "Upright, turned: width fore and aft",
 * "On its side (width up), length fore and aft".
 */
export function describePlacement(p: Placement): string {
  const along = `${AXIS_WORD[p.length]} fore and aft`;
  if (isUpright(p)) return p.length === "length" ? `Upright, ${along}` : `Upright, turned: ${along}`;
  return `On its ${p.height === "length" ? "end" : "side"} (${AXIS_WORD[p.height]} up), ${along}`;
}

/** A length as a plain number in the unit: inches to 1/10,000 in, millimetres to 1/100 mm. */
export function inUnit(mm: number, unit: LengthUnit): number {
  const value = unit === "in" ? Math.round(mmToInches(mm) * 10_000) / 10_000 : Math.round(mm * 100) / 100;
  return Object.is(value, -0) ? 0 : value;
}

export function boxInUnit(box: Box, unit: LengthUnit): Box {
  return { length: inUnit(box.length, unit), width: inUnit(box.width, unit), height: inUnit(box.height, unit) };
}

/** "13 1/2 x 6 13/16 x 9 7/16 in" for display, in the reader's unit. */
export function describeBox(box: Box, unit: LengthUnit): string {
  const strip = (s: string) => s.replace(/ (in|mm)$/, "");
  return `${[box.length, box.width, box.height].map((v) => strip(formatLength(v, unit))).join(" × ")} ${unit}`;
}

// ---------------------------------------------------------------------------------------------
// The fit API's parameters.

export type ParamError = { ok: false; parameter: string; message: string };

export const MAX_COUNT = 20;
/** Four inches a side: more than anyone leaves round a battery or a tank. */
export const MAX_CLEARANCE_MM = 101.6;
/** Results the fit search gives unless asked for more: the snuggest fifty. */
export const DEFAULT_LIMIT = 50;
export const MAX_LIMIT = 1000;

export interface FitParams {
  unit: LengthUnit;
  item: Box;
  orientation: Orientation;
  clearanceMm: number;
  count: number;
  hull: number | null;
  limit: number;
}

export interface CheckParams {
  unit: LengthUnit;
  item: Box;
  space: Box;
  opening?: Opening;
  orientation: Orientation;
  clearanceMm: number;
}

function bad(parameter: string, message: string): ParamError {
  return { ok: false, parameter, message: `${parameter}: ${message}` };
}

function readUnit(q: URLSearchParams): { ok: true; unit: LengthUnit } | ParamError {
  const raw = (q.get("unit") ?? "").trim().toLowerCase();
  if (raw === "" || raw === "in") return { ok: true, unit: "in" };
  if (raw === "mm") return { ok: true, unit: "mm" };
  return bad("unit", 'use "in" or "mm".');
}

function readUpright(q: URLSearchParams): { ok: true; orientation: Orientation } | ParamError {
  const raw = (q.get("upright") ?? "").trim().toLowerCase();
  if (["", "false", "0", "no", "off"].includes(raw)) return { ok: true, orientation: "any" };
  if (["true", "1", "yes", "on"].includes(raw)) return { ok: true, orientation: "upright" };
  return bad("upright", 'use "true" or "false".');
}

/** A length that may be zero ("0", "0 in"); otherwise as `parseLength` reads it. */
export function parseClearance(input: string, unit: LengthUnit): { ok: true; mm: number } | { ok: false; message: string } {
  const text = input.trim();
  if (text === "" || /^0*(?:\.0*)?\s*(?:in|mm|"|)$/i.test(text)) return { ok: true, mm: 0 };
  const r = parseLength(text, unit);
  if (!r.ok) return r;
  if (r.mm > MAX_CLEARANCE_MM + 1e-9) return { ok: false, message: "at most 4 in (101.6 mm) a side." };
  return r;
}

function readClearance(q: URLSearchParams, unit: LengthUnit): { ok: true; mm: number } | ParamError {
  const r = parseClearance(q.get("clearance") ?? "", unit);
  return r.ok ? r : bad("clearance", r.message);
}

function readInteger(
  q: URLSearchParams, name: string, min: number, max: number, fallback: number | null,
): { ok: true; value: number | null } | ParamError {
  const raw = (q.get(name) ?? "").trim();
  if (raw === "") return { ok: true, value: fallback };
  if (!/^\d+$/.test(raw)) return bad(name, `must be a whole number from ${min} to ${max}.`);
  const value = Number(raw);
  if (value < min || value > max) return bad(name, `must be a whole number from ${min} to ${max}.`);
  return { ok: true, value };
}

/** GET /api/fit: length, width, height (required), unit, upright, clearance, count, hull, limit. */
export function parseFitParams(q: URLSearchParams): ({ ok: true } & FitParams) | ParamError {
  const r = readFitParams(q);
  return r.ok ? r : r.problems[0];
}

/**
 * The fit's parameters with every problem, not only the first: the fit page shows each beside
 * its field. The problems come in the order of the parameters above (the API answers the first).
 */
export function readFitParams(q: URLSearchParams): ({ ok: true } & FitParams) | { ok: false; problems: ParamError[] } {
  const unit = readUnit(q);
  if (!unit.ok) return { ok: false, problems: [unit] };
  const problems: ParamError[] = [];
  const dims: number[] = [];
  for (const name of ["length", "width", "height"] as const) {
    const raw = q.get(name);
    if (raw === null || raw.trim() === "") {
      problems.push(bad(name, "required, a size such as 13 or 13 1/2."));
      continue;
    }
    const r = parseLength(raw, unit.unit);
    if (!r.ok) problems.push(bad(name, r.message));
    else dims.push(r.mm);
  }
  const upright = readUpright(q);
  const clearance = readClearance(q, unit.unit);
  const count = readInteger(q, "count", 1, MAX_COUNT, 1);
  const hull = readInteger(q, "hull", FIRST_HULL, LAST_HULL, null);
  const limit = readInteger(q, "limit", 1, MAX_LIMIT, DEFAULT_LIMIT);
  for (const r of [upright, clearance, count, hull, limit]) if (!r.ok) problems.push(r);
  if (problems.length || !upright.ok || !clearance.ok || !count.ok || !hull.ok || !limit.ok) return { ok: false, problems };
  return {
    ok: true,
    unit: unit.unit,
    item: { length: dims[0], width: dims[1], height: dims[2] },
    orientation: upright.orientation,
    clearanceMm: clearance.mm,
    count: count.value ?? 1,
    hull: hull.value,
    limit: limit.value ?? DEFAULT_LIMIT,
  };
}

/** GET /api/fit/check: item=LxWxH, space=LxWxH (required), unit, upright, clearance, opening=WxH, face. */
export function parseCheckParams(q: URLSearchParams): ({ ok: true } & CheckParams) | ParamError {
  const unit = readUnit(q);
  if (!unit.ok) return unit;
  const boxes: Box[] = [];
  for (const name of ["item", "space"] as const) {
    const raw = q.get(name);
    if (raw === null || raw.trim() === "") return bad(name, "required, length x width x height such as 13x6.8x9.4.");
    const r = parseDimensions(raw, unit.unit, 3);
    if (!r.ok) return bad(name, r.message);
    boxes.push({ length: r.mm[0], width: r.mm[1], height: r.mm[2] });
  }
  let opening: Opening | undefined;
  const rawOpening = q.get("opening");
  if (rawOpening !== null && rawOpening.trim() !== "") {
    const r = parseDimensions(rawOpening, unit.unit, 2);
    if (!r.ok) return bad("opening", r.message);
    const face = (q.get("face") ?? "front").trim().toLowerCase();
    if (face !== "top" && face !== "front") return bad("face", 'use "top" or "front".');
    opening = { width: r.mm[0], height: r.mm[1], face };
  }
  const upright = readUpright(q);
  if (!upright.ok) return upright;
  const clearance = readClearance(q, unit.unit);
  if (!clearance.ok) return clearance;
  return {
    ok: true,
    unit: unit.unit,
    item: boxes[0],
    space: boxes[1],
    opening,
    orientation: upright.orientation,
    clearanceMm: clearance.mm,
  };
}

// ---------------------------------------------------------------------------------------------
// The fit API's answers (JSON), in the request's unit.

export interface FitHitInput {
  spaceId: number;
  slug: string;
  name: string;
  zone: { slug: string; name: string };
  hulls: { from: number; to: number };
  verdict: "fits" | "opening-too-small";
  throughOpening: boolean | null;
  opening: Opening | null;
  section: { position: number; label: string; box: Box };
  row: RowPlacement;
}

export interface OrientationJson {
  upright: boolean;
  /** Which of the item's dimensions lies along the space's length, width and height. */
  placement: Placement;
  text: string;
}

export interface FitResultJson {
  spaceId: number;
  slug: string;
  name: string;
  zone: string;
  zoneSlug: string;
  hulls: { from: number; to: number };
  throughOpening: boolean | null;
  verdict: "fits" | "opening-too-small";
  message: string;
  orientation: OrientationJson;
  /** Room left along each axis of the section: the section's size minus the item (or the row), both sides together. */
  clearances: Box;
  /** How many in the row asked for, and the axis of the section it runs along. */
  row: { count: number; axis: "length" | "width" };
  section: { position: number; label: string } & Box;
  opening: { width: number; height: number; face: "top" | "front" } | null;
}

export function orientationJson(p: Placement): OrientationJson {
  return { upright: isUpright(p), placement: { ...p }, text: describePlacement(p) };
}

export function fitResultJson(hit: FitHitInput, unit: LengthUnit): FitResultJson {
  return {
    spaceId: hit.spaceId,
    slug: hit.slug,
    name: hit.name,
    zone: hit.zone.name,
    zoneSlug: hit.zone.slug,
    hulls: { ...hit.hulls },
    throughOpening: hit.throughOpening,
    verdict: hit.verdict,
    message: VERDICT_TEXT[hit.verdict],
    orientation: orientationJson(hit.row.placement),
    clearances: boxInUnit(hit.row.leftoverMm, unit),
    row: { count: hit.row.count, axis: hit.row.axis },
    section: { position: hit.section.position, label: hit.section.label, ...boxInUnit(hit.section.box, unit) },
    opening: hit.opening
      ? { width: inUnit(hit.opening.width, unit), height: inUnit(hit.opening.height, unit), face: hit.opening.face ?? "front" }
      : null,
  };
}

export interface FitAnswerJson {
  unit: LengthUnit;
  item: Box;
  upright: boolean;
  clearance: number;
  count: number;
  hull: number | null;
  results: FitResultJson[];
}

export function fitAnswerJson(params: FitParams, hits: readonly FitHitInput[]): FitAnswerJson {
  return {
    unit: params.unit,
    item: boxInUnit(params.item, params.unit),
    upright: params.orientation === "upright",
    clearance: inUnit(params.clearanceMm, params.unit),
    count: params.count,
    hull: params.hull,
    results: hits.map((h) => fitResultJson(h, params.unit)),
  };
}
