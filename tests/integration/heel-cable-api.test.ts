// GET /api/heel and GET /api/cable (README, "API") through the route modules' loaders.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
type Loader = (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response> | Response;
let heel: Loader;
let cable: Loader;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  heel = ((await import("~/routes/api.heel")) as unknown as { loader: Loader }).loader;
  cable = ((await import("~/routes/api.cable")) as unknown as { loader: Loader }).loader;
});
afterAll(async () => t?.drop());

async function get(loader: Loader, path: string) {
  const response = await loader({ request: new Request(`http://localhost${path}`), params: {}, context: {} });
  return { status: response.status, type: response.headers.get("content-type"), body: (await response.json()) as Record<string, unknown> };
}

describe("GET /api/heel", () => {
  it("Nicholls: 100 t moved 30 ft, W 9000 t, GM 2.3718 ft → 8.0 degrees; and back, with heel=8 → GM 2.3718 ft", async () => {
    // Nicholls, Seamanship and Nautical Knowledge, p. 532: GM = 100 × 30 / (9000 × tan 8°) = 2.3718 ft
    const a = await get(heel, "/api/heel?displacement=9000&gm=2.3718&weight=100&distance=30");
    expect(a.status).toBe(200);
    expect(a.type).toMatch(/application\/json/);
    expect(a.body.heelDegrees as number).toBeCloseTo(8.0, 3);
    const b = await get(heel, "/api/heel?displacement=9000&heel=8&weight=100&distance=30");
    expect(b.body).toEqual({ gm: 2.3718 });
  });

  it("the demo class: 62 lb moved 51 in at 3,300 lb and GM 2.8 ft (33.6 in) heels her 1.63 degrees, in any one length unit", async () => {
    // By hand: tan θ = 62 × 51 / (3300 × 33.6) = 0.028517 → 1.6335°; in feet: 62 × 4.25 / (3300 × 2.8) the same.
    const inches = await get(heel, "/api/heel?displacement=3300&gm=33.6&weight=62&distance=51");
    const feet = await get(heel, "/api/heel?displacement=3300&gm=2.8&weight=62&distance=4.25");
    expect(inches.body.heelDegrees as number).toBeCloseTo(1.6335, 3);
    expect(feet.body.heelDegrees).toBe(inches.body.heelDegrees);
  });

  it("400 with a JSON message naming the parameter", async () => {
    for (const [query, parameter] of [
      ["gm=2.8&weight=62&distance=51", "displacement"],
      ["displacement=3300&gm=2.8&weight=lots&distance=51", "weight"],
      ["displacement=3300&gm=2.8&weight=62", "distance"],
      ["displacement=3300&weight=62&distance=51", "gm"],
      ["displacement=3300&gm=2.8&heel=1&weight=62&distance=51", "heel"],
    ] as const) {
      const r = await get(heel, `/api/heel?${query}`);
      expect(r.status, query).toBe(400);
      expect(r.body).toMatchObject({ error: "bad-parameter", parameter });
      expect(String(r.body.message)).toContain(parameter);
    }
  });
});

describe("GET /api/cable", () => {
  it("30 A, 11 ft one way, 3 % of 12 V, 105 °C: 6 AWG, 2.70 % drop, fuse at most 180 A", async () => {
    // ABYC E-11 as reproduced: CM = 10.75 × 30 × 22 / 0.36 = 19,708.3 → 6 AWG (NEC Ch. 9 Table 8: 26,240 CM).
    // Drop: 30 × 0.491 × 22 / 1000 = 0.3241 V = 2.70 %. 33 CFR 183.425 Table 5: 6 AWG at 105 °C 120 A; ×1.5 = 180 A.
    const r = await get(cable, "/api/cable?current=30&length=11&voltage=12&drop=3&insulation=105&engineSpace=false");
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ circularMils: 19708.3, awgByDrop: "6", awgByAmpacity: "14", awg: "6", dropPercent: 2.7, maxOvercurrentAmps: 180 });
  });

  it("422 when no conductor in the table is large enough", async () => {
    const r = await get(cable, "/api/cable?current=200&length=30&voltage=12&drop=3&insulation=60");
    expect(r.status).toBe(422);
    expect(r.body.error).toBe("nothing-large-enough");
  });

  it("400 with a JSON message naming the parameter", async () => {
    for (const [query, parameter] of [
      ["length=11&voltage=12&drop=3&insulation=105", "current"],
      ["current=30&voltage=12&drop=3&insulation=105", "length"],
      ["current=30&length=11&voltage=48&drop=3&insulation=105", "voltage"],
      ["current=30&length=11&voltage=12&drop=5&insulation=105", "drop"],
      ["current=30&length=11&voltage=12&drop=3&insulation=70", "insulation"],
      ["current=30&length=11&voltage=12&drop=3&insulation=105&engineSpace=perhaps", "engineSpace"],
    ] as const) {
      const r = await get(cable, `/api/cable?${query}`);
      expect(r.status, query).toBe(400);
      expect(r.body).toMatchObject({ error: "bad-parameter", parameter });
    }
  });
});
