// The demo spaces read straight from content-seed/spaces.yaml, and what the fit should say about
// them worked out here in inches, independently of the app's code (its own median, its own fit
// test), so that tests can hold the app to it.
import { readSeedYaml } from "./seed-files";

export type SeedBox = { lengthIn: number; widthIn: number; heightIn: number };
export type SeedSpace = {
  slug: string;
  name: string;
  zone: string;
  appliesTo: string | number;
  sections: (SeedBox & { label: string })[];
  opening?: { widthIn: number; heightIn: number; face: "top" | "front" | "side" | "end" };
  measurements?: (SeedBox & { by: string; hull: number; method: string })[];
};

export function readSeedSpaces(): SeedSpace[] {
  return readSeedYaml<SeedSpace[]>("spaces.yaml");
}

/** Sorted, middle value, or the mean of the two middle values. */
export function medianOf(values: number[]): number {
  const v = [...values].sort((a, b) => a - b);
  const m = v.length >> 1;
  return v.length % 2 ? v[m] : (v[m - 1] + v[m]) / 2;
}

/** The main section as the fit should use it: the medians of the measurements if any, in inches. */
export function mainForFit(space: SeedSpace): SeedBox {
  const ms = space.measurements ?? [];
  if (!ms.length) return space.sections[0];
  return {
    lengthIn: medianOf(ms.map((m) => m.lengthIn)),
    widthIn: medianOf(ms.map((m) => m.widthIn)),
    heightIn: medianOf(ms.map((m) => m.heightIn)),
  };
}

/** Hull ranges of the demo class (Mk I 1-298, Mk II 299-612). */
export function hullRangeOf(appliesTo: string | number): [number, number] {
  const text = String(appliesTo).toLowerCase();
  if (text === "all") return [1, 612];
  if (text === "mk1") return [1, 298];
  if (text === "mk2") return [299, 612];
  const m = /^(\d+)\s*-\s*(\d+)$/.exec(text);
  if (!m) throw new Error(`unknown appliesTo ${appliesTo}`);
  return [Number(m[1]), Number(m[2])];
}

const EPS = 1e-9;

/**
 * Spaces that take an item standing upright with `c` inches clear on every side, and whether it
 * passes the opening: the footprint may turn, the height stays up; a lid takes the footprint
 * either way round, a door in a side the narrower footprint side by the height.
 */
export function expectedUpright(item: SeedBox, c: number): { slug: string; name: string; throughOpening: boolean | null }[] {
  const long = Math.max(item.lengthIn, item.widthIn) + 2 * c;
  const short = Math.min(item.lengthIn, item.widthIn) + 2 * c;
  const up = item.heightIn + 2 * c;
  const out: { slug: string; name: string; throughOpening: boolean | null }[] = [];
  for (const space of readSeedSpaces()) {
    const sections = [mainForFit(space), ...space.sections.slice(1)];
    const fits = sections.some((s) =>
      Math.max(s.lengthIn, s.widthIn) + EPS >= long && Math.min(s.lengthIn, s.widthIn) + EPS >= short && s.heightIn + EPS >= up);
    if (!fits) continue;
    let throughOpening: boolean | null = null;
    const o = space.opening;
    if (o) {
      throughOpening = o.face === "top"
        ? Math.max(o.widthIn, o.heightIn) + EPS >= long && Math.min(o.widthIn, o.heightIn) + EPS >= short
        : o.widthIn + EPS >= short && o.heightIn + EPS >= up;
    }
    out.push({ slug: space.slug, name: space.name, throughOpening });
  }
  return out;
}
