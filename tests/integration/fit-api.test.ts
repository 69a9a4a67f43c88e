// The JSON API of the spaces and the fit check (README, "API"), through the route modules'
// loaders, against a database of this file's own.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeAppDatabase } from "../support/app";
import { createTestDatabase } from "../support/db";
import { expectedUpright, mainForFit, readSeedSpaces } from "../support/seed-spaces";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
type Loader = (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response> | Response;
const routes: Record<string, Loader> = {};

beforeAll(async () => {
  t = await createTestDatabase("template_seeded");
  // The app's pool reads DATABASE_URL when it is first imported: point it at this file's database.
  process.env.DATABASE_URL = t.url;
  for (const name of ["api.fit", "api.fit.check", "api.spaces", "api.space"]) {
    routes[name] = ((await import(`~/routes/${name}.ts`)) as { loader: Loader }).loader;
  }
});
afterAll(() => closeAppDatabase(t));

async function get(route: string, query: string, params: Record<string, string> = {}) {
  const response = await routes[route]({ request: new Request(`http://localhost/${route}?${query}`), params, context: {} });
  return { status: response.status, body: (await response.json()) as any };
}

// BCI group size chart: group 31 is 13 x 6 13/16 x 9 7/16 in.
const G31 = "length=13&width=6 13/16&height=9 7/16";

describe("GET /api/fit", () => {
  it("every space that takes a group 31 upright with 1/2 in clearance, and the openings that are too small (worked out from spaces.yaml)", async () => {
    const { status, body } = await get("api.fit", `${G31}&unit=in&upright=true&clearance=1/2`);
    expect(status).toBe(200);
    const expected = expectedUpright({ lengthIn: 13, widthIn: 6 + 13 / 16, heightIn: 9 + 7 / 16 }, 0.5);
    expect(expected.length).toBeGreaterThan(5);
    expect(body.results.map((r: any) => r.slug).sort()).toEqual(expected.map((e) => e.slug).sort());
    for (const e of expected) {
      const r = body.results.find((x: any) => x.slug === e.slug);
      expect(r.throughOpening, e.slug).toBe(e.throughOpening);
      expect(r.verdict).toBe(e.throughOpening === false ? "opening-too-small" : "fits");
    }
    expect(expected.some((e) => e.throughOpening === false)).toBe(true);
    // Those that fit outright come first; after them, those whose opening must be enlarged.
    const verdicts = body.results.map((r: any) => r.verdict);
    expect(verdicts).toEqual([...verdicts].sort((a: string, b: string) => (a === "fits" ? 0 : 1) - (b === "fits" ? 0 : 1)));
    for (const r of body.results) {
      expect(Object.keys(r)).toEqual(expect.arrayContaining(["spaceId", "name", "zone", "throughOpening", "orientation", "clearances"]));
      expect(r.orientation.upright).toBe(true);
      // At least the clearance on each side is left along every axis.
      for (const axis of ["length", "width", "height"]) expect(r.clearances[axis]).toBeGreaterThanOrEqual(1 - 1e-4);
    }
  });

  it("ranks by how snugly: the section volume never decreases down the list of those that fit", async () => {
    const { body } = await get("api.fit", `${G31}&upright=true&clearance=1/2`);
    const volumes = body.results.filter((r: any) => r.verdict === "fits").map((r: any) => r.section.length * r.section.width * r.section.height);
    for (let i = 1; i < volumes.length; i++) expect(volumes[i]).toBeGreaterThanOrEqual(volumes[i - 1] - 1e-9);
  });

  it("answers in the request's unit: the galley cabinet's room left, by hand", async () => {
    // Under the galley sink, Mk II: 15 1/2 x 13 1/2 x 14 3/4 in (median of its measurements, spaces.yaml).
    const space = readSeedSpaces().find((x) => x.slug === "galley-cabinet-starboard-mk2")!;
    expect(mainForFit(space)).toEqual({ lengthIn: 15.5, widthIn: 13.5, heightIn: 14.75 });
    const inches = (await get("api.fit", `${G31}&upright=true&clearance=1/2`)).body;
    const r = inches.results.find((x: any) => x.slug === "galley-cabinet-starboard-mk2");
    // 15.5 - 13 = 2.5; 13.5 - 6.8125 = 6.6875; 14.75 - 9.4375 = 5.3125 in.
    expect(r.clearances).toEqual({ length: 2.5, width: 6.6875, height: 5.3125 });
    expect(r.orientation.placement).toEqual({ length: "length", width: "width", height: "height" });
    // The same in millimetres (1 in = 25.4 mm exactly, NIST HB 44 App. C): 63.5, 169.8625 -> 169.86, 134.9375 -> 134.94.
    const mm = (await get("api.fit", "length=330.2&width=173.0375&height=239.7125&unit=mm&upright=true&clearance=12.7")).body;
    const m = mm.results.find((x: any) => x.slug === "galley-cabinet-starboard-mk2");
    expect(m.clearances).toEqual({ length: 63.5, width: 169.86, height: 134.94 });
    expect(mm.unit).toBe("mm");
    expect(mm.results.map((x: any) => x.slug)).toEqual(inches.results.map((x: any) => x.slug));
  });

  it("keeps to one hull's spaces, and counts items in a row", async () => {
    const seed = readSeedSpaces();
    const mk1 = seed.filter((x) => x.appliesTo === "mk1").map((x) => x.slug);
    const { body } = await get("api.fit", `${G31}&upright=true&hull=402`);
    expect(body.hull).toBe(402);
    for (const r of body.results) expect(mk1).not.toContain(r.slug);
    const two = (await get("api.fit", `${G31}&upright=true&count=2`)).body;
    const one = (await get("api.fit", `${G31}&upright=true`)).body;
    expect(two.results.length).toBeLessThan(one.results.length);
    for (const r of two.results) expect(r.row.count).toBe(2);
  });

  it.each([
    ["width=7&height=9", "length"],
    [`${G31}&unit=furlong`, "unit"],
    [`${G31}&upright=perhaps`, "upright"],
    [`${G31}&clearance=minus one`, "clearance"],
    [`${G31}&count=0`, "count"],
    [`${G31}&hull=999`, "hull"],
    ["length=13&width=6 13/16&height=", "height"],
  ])("400 with a JSON message naming the parameter: %s -> %s", async (query, parameter) => {
    const { status, body } = await get("api.fit", query);
    expect(status).toBe(400);
    expect(body).toMatchObject({ error: "bad-parameter", parameter });
    expect(body.message).toMatch(new RegExp(`^${parameter}: `));
  });
});

describe("GET /api/fit/check", () => {
  it("a group 27 in a box 1/2 in larger each way, with 1/4 in clearance, and 1/16 in too small", async () => {
    // BCI group size chart: group 27 is 12 1/16 x 6 13/16 x 8 7/8 in.
    const ok = await get("api.fit.check", "item=12 1/16 x 6 13/16 x 8 7/8&space=12 9/16 x 7 5/16 x 9 3/8&upright=true&clearance=1/4");
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ fits: true, verdict: "fits", throughOpening: null, clearances: { length: 0.5, width: 0.5, height: 0.5 } });
    expect(ok.body.orientation.upright).toBe(true);
    const tight = await get("api.fit.check", "item=12 1/16 x 6 13/16 x 8 7/8&space=12 1/2 x 7 5/16 x 9 3/8&upright=true&clearance=1/4");
    expect(tight.body.fits).toBe(false);
    expect(tight.body.clearances.length).toBe(0.4375); // 12 1/2 - 12 1/16 = 7/16 in < 1/2 in needed
  });

  it("says how the items of the longest row lie, when that is not how one item lies", async () => {
    // By hand, a group 27 (12 1/16 x 6 13/16 x 8 7/8 in, BCI group size chart) upright in 27 x 13 1/2 x 21 in:
    // as one lies (length fore and aft), 2 x 12 1/16 = 24 1/8 <= 27 < 3 x 12 1/16 = 36 3/16;
    // turned (width fore and aft), 3 x 6 13/16 = 20 7/16 <= 27 < 4 x 6 13/16 = 27 1/4: so 3, turned.
    const r = await get("api.fit.check", "item=12 1/16 x 6 13/16 x 8 7/8&space=27 x 13 1/2 x 21&upright=true");
    expect(r.body).toMatchObject({ fits: true, inARow: 3, row: { count: 3, along: "length" } });
    expect(r.body.row.orientation.upright).toBe(true);
    expect(r.body.row.orientation.placement.length).toBe("width");
    // One item alone.
    const one = await get("api.fit.check", "item=12 1/16 x 6 13/16 x 8 7/8&space=12 9/16 x 7 5/16 x 9 3/8&upright=true");
    expect(one.body).toMatchObject({ inARow: 1, row: null });
  });

  it("says when only the opening is too small", async () => {
    const r = await get("api.fit.check", "item=13x6.8125x9.4375&space=16x10x12&opening=12x10&face=top&upright=true");
    expect(r.body).toMatchObject({ fits: false, verdict: "opening-too-small", throughOpening: false });
    expect(r.body.message).toContain("the opening must be enlarged");
  });

  it("turns the item on its side when any orientation is allowed", async () => {
    // 14 x 10 x 7 1/2 in takes a group 31 only on its side (13 along, 9 7/16 across, 6 13/16 up).
    const r = await get("api.fit.check", "item=13 x 6 13/16 x 9 7/16&space=14x10x7 1/2");
    expect(r.body.fits).toBe(true);
    expect(r.body.orientation).toMatchObject({ upright: false, placement: { length: "length", width: "height", height: "width" } });
    expect(r.body.clearances).toEqual({ length: 1, width: 0.5625, height: 0.6875 });
  });

  it.each([
    ["space=14x8x11", "item"],
    ["item=13x7x9&space=14x8", "space"],
    ["item=13x7x9&space=14x8x11&face=top&opening=12", "opening"],
    ["item=13x7x9&space=14x8x11&clearance=x", "clearance"],
  ])("400 naming the parameter: %s -> %s", async (query, parameter) => {
    const { status, body } = await get("api.fit.check", query);
    expect(status).toBe(400);
    expect(body.parameter).toBe(parameter);
  });
});

describe("GET /api/spaces and /api/spaces/:id", () => {
  it("lists every space with the consensus of its measurements (medians computed here)", async () => {
    const { status, body } = await get("api.spaces", "unit=in");
    expect(status).toBe(200);
    const seed = readSeedSpaces();
    expect(body.spaces).toHaveLength(seed.length);
    for (const space of seed) {
      const got = body.spaces.find((x: any) => x.slug === space.slug);
      if (!space.measurements?.length) {
        expect(got.consensus).toBeNull();
        continue;
      }
      const main = mainForFit(space);
      expect(got.consensus.count).toBe(space.measurements.length);
      expect(got.consensus.length.consensus).toBeCloseTo(main.lengthIn, 4);
      expect(got.consensus.width.consensus).toBeCloseTo(main.widthIn, 4);
      expect(got.consensus.height.consensus).toBeCloseTo(main.heightIn, 4);
      expect(got.sections[0].fit.height).toBeCloseTo(main.heightIn, 4);
    }
  });

  it("one space by id or slug, with its measurements and the flagged one", async () => {
    const bySlug = await get("api.space", "unit=in", { id: "port-settee-fwd" });
    expect(bySlug.status).toBe(200);
    const byId = await get("api.space", "unit=in", { id: String(bySlug.body.space.id) });
    expect(byId.body).toEqual(bySlug.body);
    const ms = bySlug.body.space.measurements;
    expect(ms).toHaveLength(4);
    // Heights 11.75, 11.75, 12.75, 11.732 in: the 12.75 is 1 in from the median (11.75) and flagged.
    expect(ms.filter((m: any) => m.flagged.length).map((m: any) => [m.height, m.flagged])).toEqual([[12.75, ["height"]]]);
    expect(bySlug.body.space.consensus.height).toMatchObject({ consensus: 11.75, spread: 1.018, outlierLimit: 0.25 });
  });

  it("404 for an unknown space, 400 for a bad unit or hull", async () => {
    const missing = await get("api.space", "", { id: "no-such-space" });
    expect(missing.status).toBe(404);
    expect(missing.body.error).toBe("not-found");
    expect((await get("api.space", "unit=yards", { id: "lazarette" })).body.parameter).toBe("unit");
    expect((await get("api.space", "", { id: "Lazarette!" })).body.parameter).toBe("id");
    expect((await get("api.spaces", "hull=0")).body.parameter).toBe("hull");
    const mm = await get("api.spaces", "unit=mm&hull=402");
    expect(mm.status).toBe(200);
    expect(mm.body.unit).toBe("mm");
  });
});
