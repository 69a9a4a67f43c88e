// Numbers for readers: attaching a cable run or a weight move to a write-up from the editor, and
// removing one, through the editor's route module against this file's database; who may do it;
// and that they go through review like the text: the published page shows the published
// revision's numbers, the review page a revision's own with what it adds and takes off. Also: the editor's address after a save or a send tells
// the page to clear the copy kept on the device.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let editor: typeof import("~/routes/my.writeups.$id");
let published: typeof import("~/routes/writeup");
let cableTool: typeof import("~/routes/tools.cable");
let signIn: typeof import("~/routes/sign-in");
let calculations: typeof import("~/models/calculations.server");
let review: typeof import("~/routes/review.$revisionId");
let editing: typeof import("~/models/writeup-editing.server");
let domain: typeof import("~/domain/calculations");
let appPool: { end(): Promise<void> };
let DEMO_PASSWORD: string;

const args = (request: Request, params: Record<string, string> = {}) => ({ request, params, context: {} }) as never;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [editor, published, cableTool, signIn, calculations, domain, review, editing] = await Promise.all([
    import("~/routes/my.writeups.$id"), import("~/routes/writeup"), import("~/routes/tools.cable"), import("~/routes/sign-in"),
    import("~/models/calculations.server"), import("~/domain/calculations"), import("~/routes/review.$revisionId"),
    import("~/models/writeup-editing.server"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
  appPool = (await import("~/db/index.server")).pool;
});
afterAll(async () => {
  await appPool?.end();
  await t?.drop();
});

async function signInAs(email: string) {
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  return cookieFrom(r.response!);
}

async function writeupId(slug: string): Promise<number> {
  const r = await t.db.execute<{ id: number }>(sql`select id from writeups where slug = ${slug}`);
  return r.rows[0].id;
}

const post = (id: number | "new", cookie: string | undefined, fields: Record<string, string>) =>
  settle(() => editor.action(args(formRequest(`/my/writeups/${id}`, fields, { cookie }), { id: String(id) })));

const TRAILER = "trailer-bunks-keel-pad-and-lights"; // Hal's, published
const TRIM = "bow-down-trim-after-anchor-and-chain"; // Hal's, published
const LED = "led-cabin-lights-and-a-rewired-lighting-circuit"; // Joan's, awaiting review

// A 6 A trailer-light feed, 25 ft one way, 12 V, 3 % drop, 105 °C insulation.
const cableFields = { intent: "calc-cable", label: "Tow vehicle plug to the trailer lights", current: "6", length: "25", voltage: "12", drop: "3", insulation: "105" };

let hal: string;
let gareth: string;
let joan: string;
let nora: string; // a moderator
const userIds = { hal: 0, nora: 0 };
beforeAll(async () => {
  [hal, gareth, joan, nora] = await Promise.all([
    signInAs("hal.dunmore@example.com"), signInAs("gareth.lindqvist@example.com"), signInAs("joan.pettifer@example.org"), signInAs("nora.pelling@example.org"),
  ]);
  const rows = (await t.db.execute<{ id: number; email: string }>(sql`select id, email from users where email in ('hal.dunmore@example.com', 'nora.pelling@example.org')`)).rows;
  userIds.hal = rows.find((u) => u.email.startsWith("hal"))!.id;
  userIds.nora = rows.find((u) => u.email.startsWith("nora"))!.id;
});

type Preview = { kind: string; preview: { calc: import("~/domain/calculations").Calculation; title: string } };

describe("a cable run, worked out and then attached", () => {
  it("shows the result before anything is stored", async () => {
    const id = await writeupId(TRAILER);
    const before = await calculations.listWriteupCalculations(t.db, id);
    const r = await post(id, hal, { ...cableFields, step: "check" });
    expect(r.status).toBe(200);
    const { preview } = r.data as Preview;
    expect(preview.calc.kind).toBe("cable-run");
    expect(preview.title).toBe(cableFields.label);
    // CM = K·I·L / E with K = 10.75, L the round trip (ABYC E-11 as widely reproduced):
    // 10.75 × 6 A × 50 ft / 0.36 V = 8,958.3 CM → 10 AWG by area (10,380 CM; 12 AWG has 6,530 CM,
    // NEC Chapter 9 Table 8). By resistance 10 AWG is not enough: 1.24 Ω per 1000 ft (NEC Chapter 9
    // Table 8, uncoated copper) × 50 ft × 6 A = 0.372 V > 0.36 V; 8 AWG (0.778 Ω) gives 0.233 V.
    const result = domain.computeCableRun(preview.calc.input as never);
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.requiredCircularMils).toBeCloseTo(8958.3, 1);
      expect(result.sizes.byArea).toBe("10");
      expect(result.sizes.byResistance).toBe("8");
      expect(result.dropSize).toBe("8");
      expect(result.actualDropV).toBeCloseTo(0.778 * 0.05 * 6, 3);
    }
    expect(await calculations.listWriteupCalculations(t.db, id)).toHaveLength(before.length);
  });

  it("gives each wrong field its own message and stores nothing", async () => {
    const id = await writeupId(TRAILER);
    const r = await post(id, hal, { ...cableFields, current: "lots", length: "", step: "attach" });
    expect(r.status).toBe(400);
    const errors = (r.data as { errors: Record<string, string> }).errors;
    expect(errors).toEqual({ current: "Enter the current in amps, e.g. 30.", length: expect.any(String) });
    const noLabel = await post(id, hal, { ...cableFields, label: " ", step: "attach" });
    expect(noLabel.status).toBe(400);
    expect((noLabel.data as { errors: Record<string, string> }).errors).toEqual({ label: expect.stringMatching(/what the run feeds/i) });
    expect(await calculations.listWriteupCalculations(t.db, id)).toHaveLength(0);
  });

  it("only the author attaches and removes it: not another member, not a moderator, not through another write-up", async () => {
    const id = await writeupId(TRIM);
    const r = await post(id, hal, { ...cableFields, step: "attach" });
    expect(r.status).toBe(200);
    const attached = (r.data as { attached: number }).attached;
    const list = await calculations.listWriteupCalculations(t.db, id);
    expect(list.map((c) => [c.id, c.kind, c.title])).toEqual([[attached, "cable-run", cableFields.label]]);

    for (const other of [joan, gareth]) { // another member, and a moderator; neither wrote it
      const byOther = await post(id, other, { intent: "calc-remove", calculationId: String(attached) });
      expect(byOther.status).toBe(404);
      const addByOther = await post(id, other, { ...cableFields, step: "attach" });
      expect(addByOther.status).toBe(404);
    }
    expect(await calculations.listWriteupCalculations(t.db, id)).toHaveLength(1);

    // Nor can the author remove it through another of their write-ups.
    const wrongWriteup = await post(await writeupId(TRAILER), hal, { intent: "calc-remove", calculationId: String(attached) });
    expect(wrongWriteup.status).toBe(404);

    // Taken off in the revision that attached it, it is gone for good.
    const removed = await post(id, hal, { intent: "calc-remove", calculationId: String(attached) });
    expect(removed.status).toBe(200);
    expect(await calculations.listWriteupCalculations(t.db, id)).toEqual([]);
    expect((await t.db.execute(sql`select 1 from writeup_calculations where id = ${attached}`)).rows).toHaveLength(0);
  });
});

describe("numbers go through review like the text", () => {
  const shownTo = async (slug: string) => {
    const page = await settle(() => published.loader(args(getRequest(`/writeups/${slug}`), { slug })));
    expect(page.status).toBe(200);
    return (page.data as { calculations: { id: number }[] }).calculations.map((c) => c.id);
  };
  const revisions = async (id: number) =>
    (await t.db.execute<{ id: number; number: number; status: string }>(sql`select id, number, status from writeup_revisions where writeup_id = ${id} order by number`)).rows;
  const reviewPage = async (revisionId: number) => {
    const r = await settle(() => review.loader(args(getRequest(`/review/${revisionId}`, nora), { revisionId: String(revisionId) })));
    expect(r.status).toBe(200);
    return r.data as { numbers: { list: { id: number; title: string; kind: string }[]; added: number[]; removed: { id: number; title: string }[] } };
  };
  const publish = (revisionId: number) => editing.decide(t.db, {
    revisionId, moderatorId: userIds.nora, decision: "publish", reason: "", appUrl: "http://127.0.0.1:3000",
    checklist: { cautions: true, measurements: true, photos: true, tone: true },
  });

  it("an attachment to a published write-up waits in a new revision until a moderator publishes it", async () => {
    const id = await writeupId(TRAILER);
    const before = await revisions(id);
    expect(before.at(-1)?.status).toBe("published");
    const r = await post(id, hal, { ...cableFields, step: "attach" });
    expect(r.status).toBe(200);
    const attached = (r.data as { attached: number }).attached;

    // A new draft revision carries it; readers still see the published revision's (empty) set.
    const after = await revisions(id);
    expect(after).toHaveLength(before.length + 1);
    expect(after.at(-1)).toMatchObject({ number: before.at(-1)!.number + 1, status: "draft" });
    expect((await calculations.listWriteupCalculations(t.db, id)).map((c) => [c.id, c.revisionId])).toEqual([[attached, after.at(-1)!.id]]);
    expect(await shownTo(TRAILER)).toEqual([]);

    // Sent for review: the moderator's page shows the revision's numbers, this one marked as added.
    await editing.submitForReview(t.db, id, userIds.hal);
    expect(await shownTo(TRAILER)).toEqual([]);
    const page = await reviewPage(after.at(-1)!.id);
    expect(page.numbers.list.map((c) => [c.id, c.kind, c.title])).toEqual([[attached, "cable-run", cableFields.label]]);
    expect(page.numbers.added).toEqual([attached]);
    expect(page.numbers.removed).toEqual([]);

    // Published: now readers see it.
    await publish(after.at(-1)!.id);
    expect(await shownTo(TRAILER)).toEqual([attached]);
  });

  it("a removal also waits: readers keep the numbers until the revision that takes them off is published", async () => {
    const id = await writeupId(TRAILER);
    const [attached] = await shownTo(TRAILER);
    const before = await revisions(id);
    const removed = await post(id, hal, { intent: "calc-remove", calculationId: String(attached) });
    expect(removed.status).toBe(200);
    const after = await revisions(id);
    expect(after.at(-1)).toMatchObject({ number: before.at(-1)!.number + 1, status: "draft" });
    expect(await calculations.listWriteupCalculations(t.db, id)).toEqual([]);
    expect(await shownTo(TRAILER)).toEqual([attached]);
    // The revision that was published keeps its set.
    expect((await calculations.listRevisionCalculations(t.db, before.at(-1)!.id)).map((c) => c.id)).toEqual([attached]);

    await editing.submitForReview(t.db, id, userIds.hal);
    const page = await reviewPage(after.at(-1)!.id);
    expect(page.numbers.list).toEqual([]);
    expect(page.numbers.removed.map((c) => [c.id, c.title])).toEqual([[attached, cableFields.label]]);
    expect(await shownTo(TRAILER)).toEqual([attached]);

    await publish(after.at(-1)!.id);
    expect(await shownTo(TRAILER)).toEqual([]);
  });

  it("numbers of a declined revision never reach readers", async () => {
    const id = await writeupId(TRIM);
    const r = await post(id, hal, { ...cableFields, label: "Anchor light feed", step: "attach" });
    expect(r.status).toBe(200);
    const rev = (await revisions(id)).at(-1)!;
    await editing.submitForReview(t.db, id, userIds.hal);
    await editing.decide(t.db, { revisionId: rev.id, moderatorId: userIds.nora, decision: "decline", reason: "These figures belong in a write-up about the anchor light.", checklist: {}, appUrl: "http://127.0.0.1:3000" });
    expect(await shownTo(TRIM)).toEqual([]);
    // The author works on from the declined text and its numbers: the next change makes a new revision.
    const attached = (r.data as { attached: number }).attached;
    expect((await calculations.listWriteupCalculations(t.db, id)).map((c) => c.id)).toEqual([attached]);
    expect((await post(id, hal, { intent: "calc-remove", calculationId: String(attached) })).status).toBe(200);
    expect((await revisions(id)).at(-1)).toMatchObject({ number: rev.number + 1, status: "draft" });
    expect(await calculations.listWriteupCalculations(t.db, id)).toEqual([]);
  });

  it("the seeded numbers belong to the published revision", async () => {
    const id = await writeupId("correcting-starboard-list-second-battery-mk2");
    const [rev] = await revisions(id);
    expect(rev.status).toBe("published");
    const seeded = await calculations.listPublishedCalculations(t.db, id);
    expect(seeded.map((c) => c.kind)).toEqual(["weight-move", "cable-run"]);
    expect(seeded.every((c) => c.revisionId === rev.id)).toBe(true);
    expect((await reviewPage(rev.id)).numbers.list.map((c) => c.id)).toEqual(seeded.map((c) => c.id));
  });
});

describe("a weight move, with the class particulars", () => {
  it("a battery moved across from starboard to port: the heel by the inclining relation", async () => {
    const id = await writeupId(TRIM);
    const r = await post(id, hal, {
      intent: "calc-move", step: "attach", name: "House battery", weight: "62", label: "The battery to port",
      fromAft: "135", fromSide: "starboard", fromOff: "25", toAft: "135", toSide: "port", toOff: "25",
    });
    expect(r.status).toBe(200);
    const [c] = await calculations.listWriteupCalculations(t.db, id);
    expect(c.kind).toBe("weight-move");
    if (c.kind !== "weight-move") return;
    const m = domain.computeWeightMove(c.input);
    // tan θ = w·y / (Δ·GM), the inclining relation (ASTM F1321; Nicholls's Seamanship and Nautical
    // Knowledge): 62 lb at 25 in off the centreline, Δ = 2,850 lb light (demo class figure) + 62 lb,
    // GM 2.8 ft (demo class figure): tan θ = (62 × 25 / 12) / (2,912 × 2.8) → 0.9076°.
    const byHand = (Math.atan((62 * 25) / 12 / (2912 * 2.8)) * 180) / Math.PI;
    expect(m.before.heelDeg).toBeCloseTo(byHand, 3);
    expect(m.after.heelDeg).toBeCloseTo(-byHand, 3);
    expect(m.acrossMm).toBeCloseTo(-50 * 25.4, 6); // 50 in to port; 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C)
    await post(id, hal, { intent: "calc-remove", calculationId: String(c.id) });
  });

  it("a position off the boat is refused beside its field", async () => {
    const id = await writeupId(TRIM);
    const r = await post(id, hal, {
      intent: "calc-move", step: "check", name: "Anchor", weight: "heavy",
      fromAft: "6", fromSide: "centre", toAft: "400", toSide: "port", toOff: "80",
    });
    expect(r.status).toBe(400);
    const errors = (r.data as { errors: Record<string, string> }).errors;
    expect(Object.keys(errors).sort()).toEqual(["toAft", "toOff", "weight"]);
    expect(errors.toOff).toMatch(/half the beam/);
  });
});

describe("who may attach numbers, and when", () => {
  it("not while the moderators have the write-up", async () => {
    const r = await post(await writeupId(LED), joan, { ...cableFields, step: "attach" });
    expect(r.status).toBe(409);
    expect((r.data as { error: string }).error).toMatch(/with the moderators/);
  });

  it("not before the draft is saved, and not without signing in", async () => {
    const r = await post("new", hal, { ...cableFields, step: "attach" });
    expect(r.status).toBe(400);
    expect((r.data as { error: string }).error).toMatch(/Save the draft first/);
    const anonymous = await post(await writeupId(TRAILER), undefined, { ...cableFields, step: "attach" });
    expect(anonymous.status).toBe(302);
    expect(anonymous.response?.headers.get("location")).toMatch(/^\/sign-in/);
    expect(await calculations.listWriteupCalculations(t.db, await writeupId(TRAILER))).toHaveLength(0);
  });
});

describe("attaching from the cable tool", () => {
  it("offers the member's own write-ups, attaches to one of them, and refuses someone else's", async () => {
    const id = await writeupId(TRAILER);
    const page = await settle(() => cableTool.loader(args(getRequest("/tools/cable?current=6&length=25&voltage=12&drop=3&insulation=105", hal))));
    const mine = (page.data as { mine: { id: number; title: string }[] }).mine;
    expect(mine.map((w) => w.id)).toContain(id);
    expect(mine.map((w) => w.id)).not.toContain(await writeupId(LED));

    // The tool sends the answer's length in millimetres with its unit: 25 ft = 7,620 mm (NIST Handbook 44, Appendix C).
    const fields = { writeupId: String(id), label: "Trailer lights", current: "6", length: "7620 mm", voltage: "12", drop: "3", insulation: "105" };
    const refused = await settle(() => cableTool.action(args(formRequest("/tools/cable", fields, { cookie: gareth }))));
    expect(refused.status).toBe(404);
    expect((refused.data as { attachErrors: Record<string, string> }).attachErrors.writeupId).toMatch(/No such write-up of yours/);
    expect(await calculations.listWriteupCalculations(t.db, id)).toHaveLength(0);

    const r = await settle(() => cableTool.action(args(formRequest("/tools/cable", fields, { cookie: hal }))));
    expect(r.status).toBe(302);
    expect(r.response?.headers.get("location")).toBe(`/my/writeups/${id}`);
    const [c] = await calculations.listWriteupCalculations(t.db, id);
    expect(c.kind === "cable-run" && c.input.oneWayLengthMm).toBeCloseTo(7620, 6);
    await post(id, hal, { intent: "calc-remove", calculationId: String(c.id) });
  });
});

describe("the copy kept on the device", () => {
  const draft = {
    title: "A drain for the anchor locker", summary: "A through-hull drain keeps the locker dry.", body: "Drilled and bedded.",
    systems: "hull-keel", appliesTo: "all",
  };

  it("a new draft's first save and a send for review lead to an address that clears it", async () => {
    const saved = await post("new", hal, { ...draft, intent: "save" });
    expect(saved.status).toBe(302);
    const location = saved.response!.headers.get("location")!;
    expect(location).toMatch(/^\/my\/writeups\/\d+\?kept=new$/);
    const id = Number(/\/(\d+)\?/.exec(location)![1]);
    const sent = await post(id, hal, { ...draft, intent: "submit" });
    expect(sent.status).toBe(302);
    expect(sent.response!.headers.get("location")).toBe(`/my/writeups/${id}?kept=${id}`);
  });
});
