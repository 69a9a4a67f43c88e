// Changing and removing measurements through the space page's action, as members and moderators
// would: who may, the consensus section by section, the indexed fit box and the fit answer after
// each change, and the history kept of it.
//
// Sources of the reference values:
// - 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
// - The median: the middle value of the sorted values, or for an even count the mean of the two
//   middle values (NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.5.1, "Measures of
//   Location"). Each median below is worked out by hand in the comment beside it.
// - The anchor locker's three seeded measurements (invented demo data, content-seed/spaces.yaml):
//   Hal 13 1/2 x 15 1/2 x 12 3/4, Nora 13 5/8 x 15 3/8 x 12 5/8, Tomasz 13 3/8 x 15 1/2 x 12 7/8 in;
//   its second section, "forward taper at the stem", 5 x 8 x 9 in, nobody has measured.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, closeAppDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let space: typeof import("~/routes/space");
let apiFit: typeof import("~/routes/api.fit");
let apiSpace: typeof import("~/routes/api.space");
let signIn: typeof import("~/routes/sign-in");
let DEMO_PASSWORD: string;

const IN = 25.4;
const SLUG = "anchor-locker";
const args = (request: Request, params: Record<string, string> = {}) => ({ request, params, context: {} }) as never;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [space, apiFit, apiSpace, signIn] = await Promise.all([
    import("~/routes/space"), import("~/routes/api.fit"), import("~/routes/api.space"), import("~/routes/sign-in"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
});
afterAll(() => closeAppDatabase(t));

async function signInAs(email: string) {
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  return cookieFrom(r.response!);
}

function post(cookie: string, fields: Record<string, string>) {
  return settle(() => space.action(args(formRequest(`/spaces/${SLUG}`, { unit: "in", ...fields }, { cookie }), { slug: SLUG })));
}

async function measurementOf(email: string, section = 0) {
  const rows = await t.db.execute<{ id: number; height_mm: number }>(sql`
    select m.id, m.height_mm from space_measurements m join spaces s on s.id = m.space_id join users u on u.id = m.user_id
     where s.slug = ${SLUG} and u.email = ${email} and m.section = ${section} order by m.id`);
  return rows.rows[0];
}

/** The stored consensus and indexed fit box of a section, in inches. */
async function section(position: number) {
  const rows = await t.db.execute<{ ch: number | null; upright_h: number; any_small: number }>(sql`
    select ss.consensus_height_mm as ch, cube_ll_coord(ss.fit_upright, 3) as upright_h, cube_ll_coord(ss.fit_any, 3) as any_small
      from space_sections ss join spaces s on s.id = ss.space_id where s.slug = ${SLUG} and ss.position = ${position}`);
  const r = rows.rows[0];
  return { consensusHeight: r.ch === null ? null : r.ch / IN, uprightHeight: r.upright_h / IN, smallestAnyWay: r.any_small / IN };
}

/** The anchor locker's entry in the fit answer for a box, or undefined when it does not take it. */
async function fitAnswer(query: string) {
  const r = await apiFit.loader(args(getRequest(`/api/fit?${query}&limit=1000`)));
  expect(r.status).toBe(200);
  const body = (await r.json()) as { results: { slug: string; verdict: string; section: { position: number } }[] };
  return body.results.find((x) => x.slug === SLUG);
}

async function changes() {
  return (await t.db.execute<{ kind: string; reason: string; before: { heightMm: number }; after: { heightMm: number } | null; changer: string }>(sql`
    select c.kind, c.reason, c.before, c.after, u.email as changer from measurement_changes c
      join users u on u.id = c.changed_by join spaces s on s.id = c.space_id where s.slug = ${SLUG} order by c.id`)).rows;
}

const edit = (id: number, height: string, extra: Record<string, string> = {}) => ({
  intent: "edit", measurementId: String(id), section: "0", length: "13 1/2", width: "15 1/2", height,
  method: "tape", hullNumber: "211", measuredOn: "2024-03-09", ...extra,
});

describe("changing a measurement", () => {
  it("the seeded consensus to start from", async () => {
    // Heights 12 3/4, 12 5/8, 12 7/8: sorted 12 5/8, 12 3/4, 12 7/8, median 12 3/4.
    expect((await section(0)).consensusHeight).toBeCloseTo(12.75, 9);
    // A box 10 x 10 x 12.8 in, upright, is 0.05 in too tall for it.
    expect(await fitAnswer("length=10&width=10&height=12.8&upright=true")).toBeUndefined();
  });

  it("another member can neither change nor remove it, and nothing moves", async () => {
    const lena = await signInAs("lena.marchetti@example.com"); // a member who did not take it
    const hal = await measurementOf("hal.dunmore@example.com");
    const r = await post(lena, edit(hal.id, "13 1/2"));
    expect(r.status).toBe(403);
    expect(r.thrown).toBe(true);
    const d = await post(lena, { intent: "delete", measurementId: String(hal.id), reason: "mine is better" });
    expect(d.status).toBe(403);
    expect((await measurementOf("hal.dunmore@example.com")).height_mm).toBeCloseTo(12.75 * IN, 9);
    expect(await changes()).toEqual([]);
    // Not signed in: to the sign-in page.
    const anonymous = await settle(() => space.action(args(formRequest(`/spaces/${SLUG}`, edit(hal.id, "13 1/2")), { slug: SLUG })));
    expect(anonymous.status).toBe(302);
    expect(anonymous.response!.headers.get("location")).toMatch(/^\/sign-in/);
  });

  it("a mistake is answered beside its field with everything typed kept, and nothing is stored", async () => {
    const hal = await signInAs("hal.dunmore@example.com");
    const mine = await measurementOf("hal.dunmore@example.com");
    const r = await post(hal, edit(mine.id, "13 1/2 x", { reason: "measured again" }));
    expect(r.status).toBe(400);
    const result = (r.data as { intent: string; result: { error: Record<string, string[]>; initialValue: Record<string, string> } }).result;
    expect((r.data as { intent: string }).intent).toBe("edit");
    expect(Object.keys(result.error)).toEqual(["height"]);
    expect(result.initialValue).toMatchObject({ height: "13 1/2 x", length: "13 1/2", reason: "measured again" });
    expect((await measurementOf("hal.dunmore@example.com")).height_mm).toBeCloseTo(12.75 * IN, 9);
  });

  it("its author changes it: consensus, indexed fit box and fit answer follow, and the change is kept", async () => {
    const hal = await signInAs("hal.dunmore@example.com");
    const mine = await measurementOf("hal.dunmore@example.com");
    const r = await post(hal, edit(mine.id, "13 1/2", { reason: "measured again to the deckhead" }));
    expect(r.status).toBe(302);
    // Heights 13 1/2, 12 5/8, 12 7/8: sorted 12 5/8, 12 7/8, 13 1/2, median 12 7/8.
    const main = await section(0);
    expect(main.consensusHeight).toBeCloseTo(12.875, 9);
    expect(main.uprightHeight).toBeCloseTo(12.875, 9); // the GiST-indexed cube follows the stored consensus
    // 13 3/8 x 15 1/2 x 12 7/8 (medians of length, width and height) sorted: 12 7/8 is the smallest.
    expect(main.smallestAnyWay).toBeCloseTo(12.875, 9);
    // Now the 12.8 in box fits, upright, through the 12 1/2 x 10 1/4 in lid.
    expect((await fitAnswer("length=10&width=10&height=12.8&upright=true"))?.verdict).toBe("fits");
    // The page and the API show it too.
    const api = await apiSpace.loader(args(getRequest(`/api/spaces/${SLUG}`), { id: SLUG }));
    const body = (await api.json()) as { space: { consensus: { height: { consensus: number } }; measurements: { id: number; height: number; updatedAt: string | null }[]; changes: { kind: string; by: string }[] } };
    expect(body.space.consensus.height.consensus).toBe(12.875);
    expect(body.space.measurements.find((m) => m.id === mine.id)).toMatchObject({ height: 13.5 });
    expect(body.space.measurements.find((m) => m.id === mine.id)!.updatedAt).not.toBeNull();
    expect(body.space.changes[0]).toMatchObject({ kind: "edited", by: "Hal Dunmore, hull 211" });
    const history = await changes();
    expect(history).toHaveLength(1);
    expect(history[0]).toMatchObject({ kind: "edited", changer: "hal.dunmore@example.com", reason: "measured again to the deckhead" });
    expect(history[0].before.heightMm).toBeCloseTo(12.75 * IN, 9);
    expect(history[0].after!.heightMm).toBeCloseTo(13.5 * IN, 9);
  });

  it("a moderator removes another member's measurement only with a reason; the consensus and the fit follow", async () => {
    const nora = await signInAs("nora.pelling@example.org"); // a moderator (content-seed/members.yaml)
    const tomasz = await measurementOf("tomasz.wren@example.org");
    const refused = await post(nora, { intent: "delete", measurementId: String(tomasz.id) });
    expect(refused.status).toBe(400);
    expect(Object.keys((refused.data as { result: { error: Record<string, string[]> } }).result.error)).toEqual(["reason"]);
    expect(await measurementOf("tomasz.wren@example.org")).toBeDefined();

    const r = await post(nora, { intent: "delete", measurementId: String(tomasz.id), reason: "Measured the forward taper, not the main part" });
    expect(r.status).toBe(302);
    expect(await measurementOf("tomasz.wren@example.org")).toBeUndefined();
    // Heights 13 1/2, 12 5/8: an even count, the mean of the two, (12.625 + 13.5) / 2 = 13.0625.
    expect((await section(0)).consensusHeight).toBeCloseTo(13.0625, 9);
    expect((await fitAnswer("length=10&width=10&height=13&upright=true"))?.verdict).toBe("fits");
    const last = (await changes()).at(-1)!;
    expect(last).toMatchObject({ kind: "deleted", changer: "nora.pelling@example.org", after: null });
    expect(last.before.heightMm).toBeCloseTo(12.875 * IN, 9);
  });
});

describe("measurements of another section", () => {
  it("a part out of range is refused beside its field", async () => {
    const hal = await signInAs("hal.dunmore@example.com");
    const r = await post(hal, {
      intent: "add", section: "2", length: "6", width: "8", height: "9", method: "tape", hullNumber: "211", measuredOn: "2025-05-01",
    });
    expect(r.status).toBe(400);
    expect(Object.keys((r.data as { result: { error: Record<string, string[]> } }).result.error)).toEqual(["section"]);
  });

  it("each section has its own consensus; the fit uses it, and the recorded size again once none is left", async () => {
    const hal = await signInAs("hal.dunmore@example.com");
    // A box 8 1/2 x 7 1/2 x 5 1/2 in, any way up: sorted 8 1/2, 7 1/2, 5 1/2. The forward taper as
    // recorded (9, 8, 5 sorted) is 1/2 in too small; the main part takes it.
    const query = "length=8.5&width=7.5&height=5.5&upright=false";
    expect((await fitAnswer(query))?.section.position).toBe(0);
    const before = await section(0);

    const r = await post(hal, {
      intent: "add", section: "1", length: "6", width: "8", height: "9", method: "tape", hullNumber: "211", measuredOn: "2025-05-01",
    });
    expect(r.status).toBe(302);
    // One measurement of the taper, 6 x 8 x 9 in: its consensus (sorted 9, 8, 6) takes the box,
    // and it is the snugger of the two sections.
    const taper = await section(1);
    expect(taper.consensusHeight).toBeCloseTo(9, 9);
    expect(taper.smallestAnyWay).toBeCloseTo(6, 9);
    expect((await fitAnswer(query))?.section.position).toBe(1);
    // The main part's consensus is not touched by a measurement of another part.
    expect((await section(0)).consensusHeight).toBeCloseTo(before.consensusHeight!, 9);
    const api = await apiSpace.loader(args(getRequest(`/api/spaces/${SLUG}`), { id: SLUG }));
    const body = (await api.json()) as { space: { sections: { position: number; consensus: { count: number; length: { consensus: number } } | null }[] } };
    expect(body.space.sections[1].consensus).toMatchObject({ count: 1, length: { consensus: 6 } });

    const mine = await measurementOf("hal.dunmore@example.com", 1);
    const d = await post(hal, { intent: "delete", measurementId: String(mine.id) });
    expect(d.status).toBe(302);
    const after = await section(1);
    expect(after.consensusHeight).toBeNull();
    expect(after.smallestAnyWay).toBeCloseTo(5, 9); // the recorded 5 x 8 x 9 in again
    expect((await fitAnswer(query))?.section.position).toBe(0);
  });
});
