// The spaces as the API shows them, in the request's unit.
import type { BoxConsensus, DimensionConsensus } from "~/domain/consensus";
import { boxInUnit, inUnit } from "~/domain/fit-search";
import type { LengthUnit } from "~/domain/units";
import type { Measurement, SpaceSummary } from "~/models/spaces.server";

export function readApiUnit(q: URLSearchParams): LengthUnit | null {
  const raw = (q.get("unit") ?? "").trim().toLowerCase();
  if (raw === "" || raw === "in") return "in";
  if (raw === "mm") return "mm";
  return null;
}

function dimensionJson(d: DimensionConsensus, unit: LengthUnit) {
  return {
    consensus: inUnit(d.consensus, unit),
    spread: inUnit(d.spread, unit),
    outlierLimit: d.outlierLimit === null ? null : inUnit(d.outlierLimit, unit),
  };
}

export function spaceJson(sp: SpaceSummary, unit: LengthUnit) {
  return {
    id: sp.id,
    slug: sp.slug,
    name: sp.name,
    zone: sp.zone.name,
    zoneSlug: sp.zone.slug,
    hulls: sp.hulls,
    position: {
      aftOfBow: inUnit(sp.position.aftOfBowMm, unit),
      offCentre: inUnit(sp.position.offCentreMm, unit),
      height: sp.position.heightMm === null ? null : inUnit(sp.position.heightMm, unit),
    },
    opening: sp.opening
      ? { width: inUnit(sp.opening.widthMm, unit), height: inUnit(sp.opening.heightMm, unit), face: sp.opening.face }
      : null,
    obstructions: sp.obstructions,
    sections: sp.sections.map((sec) => ({
      position: sec.position,
      label: sec.label,
      ...boxInUnit(sec.described, unit),
      fit: boxInUnit(sec.fit, unit),
    })),
    measurementCount: sp.measurementCount,
    consensus: sp.consensus
      ? {
          count: sp.consensus.count,
          length: dimensionJson(sp.consensus.length, unit),
          width: dimensionJson(sp.consensus.width, unit),
          height: dimensionJson(sp.consensus.height, unit),
        }
      : null,
  };
}

/** Which of a measurement's dimensions sit far from the others (consensus.ts). */
export function flaggedDimensions(index: number, consensus: BoxConsensus | null): ("length" | "width" | "height")[] {
  if (!consensus) return [];
  return (["length", "width", "height"] as const).filter((axis) => consensus[axis].outliers.includes(index));
}

export function measurementJson(m: Measurement, index: number, consensus: BoxConsensus | null, unit: LengthUnit) {
  return {
    id: m.id,
    by: m.by,
    hullNumber: m.hullNumber,
    method: m.method,
    measuredOn: m.measuredOn,
    ...boxInUnit(m.box, unit),
    flagged: flaggedDimensions(index, consensus),
  };
}
