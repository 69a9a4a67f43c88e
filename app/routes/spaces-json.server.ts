// The spaces as the API shows them, in the request's unit.
import type { BoxConsensus, DimensionConsensus } from "~/domain/consensus";
import { boxInUnit, inUnit } from "~/domain/fit-search";
import type { LengthUnit } from "~/domain/units";
import type { MeasurementRecord } from "~/db/schema";
import type { Measurement, MeasurementChange, SpaceSummary } from "~/models/spaces.server";

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

function consensusJson(c: BoxConsensus | null, unit: LengthUnit) {
  return c
    ? {
        count: c.count,
        length: dimensionJson(c.length, unit),
        width: dimensionJson(c.width, unit),
        height: dimensionJson(c.height, unit),
      }
    : null;
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
      consensus: consensusJson(sec.consensus, unit),
    })),
    measurementCount: sp.measurementCount,
    // The main section's, as before sections were measured on their own.
    consensus: consensusJson(sp.consensus, unit),
  };
}

export function measurementJson(m: Measurement, unit: LengthUnit) {
  return {
    id: m.id,
    section: m.section,
    by: m.by,
    hullNumber: m.hullNumber,
    method: m.method,
    measuredOn: m.measuredOn,
    ...boxInUnit(m.box, unit),
    flagged: m.flagged,
    updatedAt: m.updated ? m.updated.at.toISOString() : null,
  };
}

function recordJson(r: MeasurementRecord, unit: LengthUnit) {
  return {
    section: r.section,
    hullNumber: r.hullNumber,
    method: r.method,
    measuredOn: r.measuredOn,
    ...boxInUnit({ length: r.lengthMm, width: r.widthMm, height: r.heightMm }, unit),
  };
}

export function changeJson(c: MeasurementChange, unit: LengthUnit) {
  return {
    measurementId: c.measurementId,
    kind: c.kind,
    at: c.at.toISOString(),
    by: c.by,
    takenBy: c.takenBy,
    reason: c.reason,
    before: recordJson(c.before, unit),
    after: c.after ? recordJson(c.after, unit) : null,
  };
}
