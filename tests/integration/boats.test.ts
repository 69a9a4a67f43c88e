// The boat page (ledger, what if, levelling, GM calibration), the class particulars page, the two
// tools and the write-up calculations, through the route modules against this file's database.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";
import { readSeedYaml } from "../support/seed-files";

let t: Awaited<ReturnType<typeof appDatabase>>;
let boat: typeof import("~/routes/boat");
let adminClass: typeof import("~/routes/admin.class");
let cableTool: typeof import("~/routes/tools.cable");
let heelTool: typeof import("~/routes/tools.heel");
let signIn: typeof import("~/routes/sign-in");
let calculations: typeof import("~/models/calculations.server");
let appPool: { end(): Promise<void> };
let DEMO_PASSWORD: string;

// NIST Handbook 44 Appendix C (exact): 1 in = 25.4 mm, 1 lb = 0.45359237 kg.
const IN = 25.4;
const LB = 0.45359237;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [boat, adminClass, cableTool, heelTool, signIn, calculations] = await Promise.all([
    import("~/routes/boat"), import("~/routes/admin.class"), import("~/routes/tools.cable"), import("~/routes/tools.heel"),
    import("~/routes/sign-in"), import("~/models/calculations.server"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
  appPool = (await import("~/db/index.server")).pool;
});
afterAll(async () => {
  await appPool?.end();
  await t?.drop();
});

const args = (request: Request, params: Record<string, string> = {}) => ({ request, params, context: {} }) as never;

async function signInAs(email: string) {
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  return cookieFrom(r.response!);
}

type Page = Awaited<ReturnType<typeof boat.loader>> extends infer R ? (R extends { data: infer D } ? D : never) : never;

async function page(hull: number, cookie: string, query = ""): Promise<Page> {
  const r = await settle(() => boat.loader(args(getRequest(`/boats/${hull}${query}`, cookie), { hull: String(hull) })));
  expect(r.status).toBe(200);
  return r.data as Page;
}

function post(hull: number, cookie: string, fields: Record<string, string>) {
  return settle(() => boat.action(args(formRequest(`/boats/${hull}`, fields, { cookie }), { hull: String(hull) })));
}

/** Heel by hand from the inclining relation: tan θ = Σ w·y / (Δ·GM), weights in lb, offsets in in, GM 2.8 ft. */
function heelByHand(items: { lb: number; offIn: number }[], lightLb = 2850, gmFt = 2.8): number {
  const moment = items.reduce((s, i) => s + (i.lb * i.offIn) / 12, 0);
  const displacement = items.reduce((s, i) => s + i.lb, lightLb);
  return (Math.atan(moment / (displacement * gmFt)) * 180) / Math.PI;
}

let gareth: string;
let lena: string;
let admin: string;
beforeAll(async () => {
  [gareth, lena, admin] = await Promise.all([
    signInAs("gareth.lindqvist@example.com"),
    signInAs("lena.marchetti@example.com"),
    signInAs("tomasz.wren@example.org"),
  ]);
});

describe("the seeded demo (content-seed/ledger.yaml)", () => {
  it("sets the class particulars to the brief's invented demo values, marked demo", async () => {
    const r = await t.db.execute<{ light_displacement_kg: number; gm_mm: number; lwl_mm: number; beam_mm: number; demo: boolean }>(sql`select * from class_particulars`);
    expect(r.rows).toHaveLength(1);
    const row = r.rows[0];
    expect(row.light_displacement_kg).toBeCloseTo(2850 * LB, 9);
    expect(row.gm_mm).toBeCloseTo(2.8 * 304.8, 9);
    expect(row.lwl_mm).toBeCloseTo((19 * 12 + 2) * IN, 9);
    expect(row.beam_mm).toBeCloseTo((7 * 12 + 10) * IN, 9);
    expect(row.demo).toBe(true);
  });

  it("puts the demo ledger aboard hull 356, and its page shows the list worked out by hand", async () => {
    const seed = readSeedYaml<{ standardItems: { slug: string; weightLb: number; position: { offCentreIn: number; side: string } }[]; boats: { hull: number; items: { standard?: string; weightLb?: number; position?: { offCentreIn: number; side: string } }[] }[] }>("ledger.yaml");
    const std = new Map(seed.standardItems.map((s) => [s.slug, s]));
    const items = seed.boats.find((b) => b.hull === 356)!.items.map((i) => {
      const s = i.standard ? std.get(i.standard) : undefined;
      const pos = i.position ?? s!.position;
      return { lb: i.weightLb ?? s!.weightLb, offIn: (pos.side === "port" ? -1 : pos.side === "starboard" ? 1 : 0) * pos.offCentreIn };
    });
    const priya = await signInAs("priya.dalton@example.com");
    const p = await page(356, priya);
    expect(p.owner).toBe(true);
    expect(p.ledger).toHaveLength(items.length);
    const { boatCondition } = await import("~/domain/ledger");
    const c = boatCondition(p.particulars!, p.entries, p.gm.mm);
    expect(c.heelDeg).toBeCloseTo(heelByHand(items), 9);
    expect(c.heelDeg).toBeGreaterThan(0.5); // demo data: she lists to starboard
    expect(p.ledger.find((i) => i.name === "House battery, group 27")?.spaceName).toMatch(/starboard settee/i);
  });
});

describe("the boat page", () => {
  it("asks a visitor to sign in, and says 404 for an unregistered hull", async () => {
    const anon = await settle(() => boat.loader(args(getRequest("/boats/402"), { hull: "402" })));
    expect(anon.status).toBe(302);
    expect(anon.response!.headers.get("location")).toMatch(/^\/sign-in\?redirectTo=%2Fboats%2F402/);
    const none = await settle(() => boat.loader(args(getRequest("/boats/600", gareth), { hull: "600" })));
    expect(none.status).toBe(404);
    const junk = await settle(() => boat.loader(args(getRequest("/boats/x1", gareth), { hull: "x1" })));
    expect(junk.status).toBe(404);
  });

  it("shows hull, variant, owners and the write-ups done on her", async () => {
    const p = await page(402, gareth);
    expect(p.boat).toMatchObject({ hullNumber: 402, name: "Marram", variant: "Mk II" });
    expect(p.boat.owners.map((o) => o.displayName)).toEqual(["Gareth Lindqvist"]);
    expect(p.owner).toBe(true);
    expect(p.writeups.map((w) => w.slug)).toContain("correcting-starboard-list-second-battery-mk2");
    expect(p.ledger).toEqual([]);
    expect(p.standardItems.map((s) => s.slug)).toEqual(expect.arrayContaining(["house-battery-group-27", "outboard-on-bracket", "outboard-fuel-3gal", "fresh-water-12gal"]));
  });

  it("keeps what the owner typed and says what is wrong beside the field", async () => {
    const r = await post(402, gareth, { intent: "add-item", unit: "in", name: "House battery", weight: "sixty", aftOfBow: "135", side: "starboard", offCentre: "25" });
    expect(r.status).toBe(400);
    const result = (r.data as { result: { error: Record<string, string[]>; initialValue: Record<string, string> } }).result;
    expect(result.error.weight[0]).toMatch(/Could not read "sixty" as a weight/);
    expect(result.initialValue).toMatchObject({ name: "House battery", weight: "sixty", aftOfBow: "135", offCentre: "25" });
    expect((await page(402, gareth)).ledger).toHaveLength(0);
  });

  it("adds, edits and removes items; a standard item comes with the class's demo figures; a space gives its place", async () => {
    const add = await post(402, gareth, { intent: "add-item", unit: "in", name: "House battery", weight: "62 lb", aftOfBow: "135", side: "starboard", offCentre: "25", height: "14" });
    expect(add.status).toBe(302);
    expect(add.response!.headers.get("location")).toBe("/boats/402?unit=in#ledger"); // Gareth reads mm; the form was in inches
    const std = await post(402, gareth, { intent: "add-standard", unit: "mm", slug: "outboard-on-bracket" });
    expect(std.status).toBe(302);
    const starboardBay = (await page(402, gareth)).spaces.find((s) => s.name.match(/starboard settee, aft/i) && s.offCentreMm > 0)!;
    const bySpace = await post(402, gareth, { intent: "add-item", unit: "mm", name: "Spare battery", weight: "20 kg", spaceId: String(starboardBay.id) });
    expect(bySpace.status).toBe(302);

    let p = await page(402, gareth);
    expect(p.ledger.map((i) => i.name)).toEqual(expect.arrayContaining(["House battery", "Outboard on its transom bracket", "Spare battery"]));
    const house = p.ledger.find((i) => i.name === "House battery")!;
    expect(house.weightKg).toBeCloseTo(62 * LB, 9);
    expect(house.offCentreMm).toBeCloseTo(25 * IN, 9);
    const outboard = p.ledger.find((i) => i.name === "Outboard on its transom bracket")!;
    expect(outboard.weightKg).toBeCloseTo(58 * LB, 9);
    expect(outboard.offCentreMm).toBeCloseTo(-14 * IN, 9);
    const spare = p.ledger.find((i) => i.name === "Spare battery")!;
    expect(spare).toMatchObject({ spaceId: starboardBay.id, aftOfBowMm: starboardBay.aftOfBowMm, offCentreMm: starboardBay.offCentreMm, heightMm: starboardBay.heightMm });

    const edit = await post(402, gareth, { intent: "edit-item", unit: "in", itemId: String(spare.itemId), name: "Spare battery", weight: "44 lb", aftOfBow: "134", side: "port", offCentre: "25" });
    expect(edit.status).toBe(302);
    p = await page(402, gareth);
    expect(p.ledger.find((i) => i.name === "Spare battery")!.offCentreMm).toBeCloseTo(-25 * IN, 9);
    const remove = await post(402, gareth, { intent: "remove-item", unit: "in", itemId: String(spare.itemId) });
    expect(remove.status).toBe(302);
    p = await page(402, gareth);
    expect(p.ledger.map((i) => i.name)).not.toContain("Spare battery");
    // The list by hand: 62 lb at 25 in to starboard, 58 lb at 14 in to port.
    const { boatCondition } = await import("~/domain/ledger");
    expect(boatCondition(p.particulars!, p.entries, p.gm.mm).heelDeg).toBeCloseTo(heelByHand([{ lb: 62, offIn: 25 }, { lb: 58, offIn: -14 }]), 9);
  });

  it("lets only the owners change the ledger", async () => {
    const r = await post(402, lena, { intent: "add-item", unit: "in", name: "Mischief", weight: "10", aftOfBow: "100", side: "centre" });
    expect(r.status).toBe(403);
    const p = await page(402, lena);
    expect(p.owner).toBe(false);
    expect(p.ledger.map((i) => i.name)).not.toContain("Mischief");
  });

  it("works out a what-if move and the weight to add, from the query, without changing anything", async () => {
    const before = await page(402, gareth);
    const house = before.ledger.find((i) => i.name === "House battery")!;
    const p = await page(402, gareth, `?unit=in&move=${house.itemId}&toSide=port&toOffCentre=26`);
    expect(p.whatIf.errors).toEqual({});
    const { computeWeightMove } = await import("~/domain/calculations");
    const r = computeWeightMove(p.whatIf.input!);
    expect(r.before.heelDeg).toBeCloseTo(heelByHand([{ lb: 62, offIn: 25 }, { lb: 58, offIn: -14 }]), 9);
    expect(r.after.heelDeg).toBeCloseTo(heelByHand([{ lb: 62, offIn: -26 }, { lb: 58, offIn: -14 }]), 9);
    expect(r.to.aftOfBowMm).toBe(house.aftOfBowMm); // left empty: stays where it was fore and aft
    const bad = await page(402, gareth, `?unit=in&move=${house.itemId}&toSide=port&toOffCentre=ninety`);
    expect(bad.whatIf.errors.toOffCentre).toMatch(/Could not read "ninety"/);
    expect(bad.whatIf.values.toOffCentre).toBe("ninety");
    // By hand: Σ w·y = 62 × 25 − 58 × 14 = 738 in·lb to starboard; at 30 in to port: 24.6 lb.
    const add = await page(402, gareth, "?unit=in&addSide=port&addOffCentre=30");
    expect(add.add.result!.weightKg! / LB).toBeCloseTo(24.6, 9);
    expect((await page(402, gareth)).ledger).toHaveLength(before.ledger.length);
  });

  it("calibrates GM from a measured list (ASTM F1321) and goes back to the class GM", async () => {
    // By hand: GM = w·d / (Δ·tan θ) = 62 × (51/12) / (3300 × tan 1.6°) = 263.5 / 92.177 = 2.8586 ft
    const r = await post(402, gareth, { intent: "calibrate", unit: "in", weight: "62", shift: "51", displacement: "3300", method: "angle", heel: "1.6" });
    expect(r.status).toBe(302);
    let p = await page(402, gareth);
    expect(p.gm.source).toBe("calibrated");
    expect(p.gm.mm! / 304.8).toBeCloseTo(2.8586, 4);
    const bad = await post(402, gareth, { intent: "calibrate", unit: "in", weight: "62", shift: "51", displacement: "3300", method: "plumb", deflection: "2" });
    expect(bad.status).toBe(400);
    expect((bad.data as { result: { error: Record<string, string[]> } }).result.error.plumbLength[0]).toMatch(/How long is the plumb line/);
    await post(402, gareth, { intent: "clear-calibration", unit: "in" });
    p = await page(402, gareth);
    expect(p.gm.source).toBe("class");
    expect(p.gm.mm! / 304.8).toBeCloseTo(2.8, 12);
  });
});

describe("the class particulars page", () => {
  it("is for administrators only", async () => {
    const r = await settle(() => adminClass.loader(args(getRequest("/admin/class", gareth))));
    expect(r.status).toBe(403);
    const w = await settle(() => adminClass.action(args(formRequest("/admin/class", { unit: "in", gm: "3" }, { cookie: gareth }))));
    expect(w.status).toBe(403);
  });

  it("shows the demo values in the admin's units, refuses bad input beside the field, saves good input", async () => {
    const r = await settle(() => adminClass.loader(args(getRequest("/admin/class", admin))));
    const d = r.data as { defaults: Record<string, string>; demo: boolean };
    expect(d.demo).toBe(true);
    expect(d.defaults).toMatchObject({ lightDisplacement: "2850 lb", gm: "2.80 ft", lwl: "230 in", beam: "94 in", gmLongitudinal: "36.00 ft" });
    const bad = await settle(() => adminClass.action(args(formRequest("/admin/class", { unit: "in", ...d.defaults, gm: "-2" }, { cookie: admin }))));
    expect(bad.status).toBe(400);
    expect((bad.data as { result: { error: Record<string, string[]> } }).result.error.gm).toBeDefined();
    const ok = await settle(() => adminClass.action(args(formRequest("/admin/class", { unit: "in", ...d.defaults, gm: "2.9 ft", demo: "on" }, { cookie: admin }))));
    expect(ok.status).toBe(302);
    const row = await t.db.execute<{ gm_mm: number }>(sql`select gm_mm from class_particulars`);
    expect(row.rows[0].gm_mm).toBeCloseTo(2.9 * 304.8, 9);
    // Put the demo value back for the rest of the file.
    await settle(() => adminClass.action(args(formRequest("/admin/class", { unit: "in", ...d.defaults }, { cookie: admin }))));
  });
});

describe("the tools", () => {
  it("the cable tool sizes the run typed in, and says what is wrong beside the field", async () => {
    const r = await settle(() => cableTool.loader(args(getRequest("/tools/cable?unit=in&current=30&length=11&voltage=12&drop=3&insulation=105", lena))));
    const d = r.data as { input: { oneWayLengthMm: number; currentA: number } | null; errors: Record<string, string> };
    expect(d.errors).toEqual({});
    expect(d.input!.oneWayLengthMm).toBeCloseTo(11 * 304.8, 9); // a bare number is feet
    const bad = await settle(() => cableTool.loader(args(getRequest("/tools/cable?unit=in&current=lots&length=11", lena))));
    expect((bad.data as { errors: Record<string, string> }).errors.current).toMatch(/amps/);
    // A visitor sizes a run too (as with the fit check); only attaching it asks for a member.
    const anon = await settle(() => cableTool.loader(args(getRequest("/tools/cable?unit=in&current=30&length=11&voltage=12&drop=3&insulation=105"))));
    const a = anon.data as { input: { oneWayLengthMm: number } | null; mine: unknown[]; signedIn: boolean };
    expect({ status: anon.status, length: a.input?.oneWayLengthMm, mine: a.mine, signedIn: a.signedIn }).toEqual({ status: 200, length: 11 * 304.8, mine: [], signedIn: false });
    const attach = await settle(() => cableTool.action(args(formRequest("/tools/cable", { writeupId: "1", current: "30", length: "11", voltage: "12", drop: "3", insulation: "105" }))));
    expect(attach.status).toBe(302);
    expect(attach.response?.headers.get("location")).toMatch(/^\/sign-in/);
  });

  it("the heel tool works out the heel from a GM, and a GM from a list", async () => {
    // By hand: 62 lb moved 51 in, 3,300 lb, GM 2.8 ft → tan θ = 263.5 / 9240 → 1.6335° to port
    const r = await settle(() => heelTool.loader(args(getRequest("/tools/heel?unit=in&find=heel&displacement=3300&weight=62&distance=51&side=port&gm=2.8", lena))));
    const a = (r.data as { answer: { find: string; heelDeg: number } }).answer;
    expect(a.heelDeg).toBeCloseTo(-1.6335, 3);
    const g = await settle(() => heelTool.loader(args(getRequest("/tools/heel?unit=in&find=gm&displacement=3300&weight=62&distance=51&method=angle&heel=1.6", lena))));
    expect((g.data as { answer: { gmMm: number } }).answer.gmMm / 304.8).toBeCloseTo(2.8586, 4);
  });
});

describe("calculations attached to a write-up", () => {
  it("the seeded write-up carries a weight move and a cable run, read by id", async () => {
    const w = await t.db.execute<{ id: number }>(sql`select id from writeups where slug = 'correcting-starboard-list-second-battery-mk2'`);
    const list = await calculations.listWriteupCalculations(t.db, w.rows[0].id);
    expect(list.map((c) => c.kind)).toEqual(["weight-move", "cable-run"]);
    const one = await calculations.getCalculation(t.db, list[0].id);
    expect(one?.kind).toBe("weight-move");
    expect(await calculations.getCalculation(t.db, 999_999)).toBeNull();
    // A new one goes to the end; it reads back as stored.
    const cable = list[1];
    const id = await calculations.addWriteupCalculation(t.db, w.rows[0].id, { kind: "cable-run", input: { ...(cable.input as object), currentA: 15 } as never }, { title: "A smaller load" });
    const again = await calculations.listWriteupCalculations(t.db, w.rows[0].id);
    expect(again.at(-1)).toMatchObject({ id, title: "A smaller load", position: 2 });
    expect(await calculations.removeWriteupCalculation(t.db, w.rows[0].id, id)).toBe(true);
  });
});
