// The conversation under a published write-up (comments, "done on my boat too") and the admins'
// boat systems page, through their route modules against a database of this file's own.
import { sql } from "drizzle-orm";
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { createRoutesStub } from "react-router";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let signIn: typeof import("~/routes/sign-in");
let writeupPage: typeof import("~/routes/writeup");
let commentsApi: typeof import("~/routes/api.writeups.$slug.comments");
let doneTooApi: typeof import("~/routes/api.writeups.$slug.done-too");
let adminTags: typeof import("~/routes/admin.tags");
let commentsUi: typeof import("~/components/comments");
let rateLimits: typeof import("~/models/rate-limits.server");
let DEMO_PASSWORD: string;

// Invented demo members (content-seed/members.yaml) and a write-up of the seed.
const NORA = "nora.pelling@example.org"; // moderator, hull 147, author of the write-up below
const PRIYA = "priya.dalton@example.com"; // member, co-owner of hull 356
const SAM = "sam.hurrell@example.com"; // member, co-owner of hull 356
const JOAN = "joan.pettifer@example.org"; // member, hull 97
const TOMASZ = "tomasz.wren@example.org"; // administrator, hull 523
const LENA = "lena.marchetti@example.com"; // member, hull 318
const SLUG = "group-27-battery-under-starboard-settee";
const DRAFT_SLUG = "bottom-blisters-opened-and-drying"; // a draft in the seed
const HOSTILE = `<script>alert(1)</script>\n<img src=x onerror="alert(2)"> & "quotes"`;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [signIn, writeupPage, commentsApi, doneTooApi, adminTags, commentsUi, rateLimits] = await Promise.all([
    import("~/routes/sign-in"), import("~/routes/writeup"), import("~/routes/api.writeups.$slug.comments"),
    import("~/routes/api.writeups.$slug.done-too"), import("~/routes/admin.tags"), import("~/components/comments"),
    import("~/models/rate-limits.server"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
});
afterAll(async () => {
  // Close the app's own pool before the database goes, so no idle client is cut off.
  await (await import("~/db/index.server")).pool.end();
  await t?.drop();
});

const args = (request: Request, params: Record<string, string> = {}) => ({ request, params, context: {} }) as never;
const cookies = new Map<string, string>();

async function cookieOf(email: string) {
  const known = cookies.get(email);
  if (known) return known;
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  const cookie = cookieFrom(r.response!);
  cookies.set(email, cookie);
  return cookie;
}

async function userId(email: string) {
  const r = await t.db.execute<{ id: number }>(sql`select id from users where email = ${email}`);
  return r.rows[0].id;
}

/** A request as the page's fetcher sends it (JSON comes back). */
async function postComment(fields: Record<string, string>, email?: string, slug = SLUG) {
  const cookie = email ? await cookieOf(email) : undefined;
  const request = formRequest(`/api/writeups/${slug}/comments`, fields, { cookie });
  return settle(() => commentsApi.action(args(request, { slug })));
}

async function postDoneToo(fields: Record<string, string>, email?: string, slug = SLUG) {
  const cookie = email ? await cookieOf(email) : undefined;
  const request = formRequest(`/api/writeups/${slug}/done-too`, fields, { cookie });
  return settle(() => doneTooApi.action(args(request, { slug })));
}

/** A request as a plain HTML form sends it, without JavaScript. */
function documentRequest(path: string, fields: Record<string, string>, cookie?: string) {
  const request = formRequest(path, fields, { cookie });
  request.headers.set("Accept", "text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8");
  request.headers.set("Sec-Fetch-Mode", "navigate");
  return request;
}

async function body(r: { response?: Response }) {
  return (await r.response!.json()) as Record<string, unknown>;
}

async function commentsInDb(slug = SLUG) {
  const r = await t.db.execute<{ id: number; body: string; email: string }>(
    sql`select c.id, c.body, u.email from comments c join writeups w on w.id = c.writeup_id join users u on u.id = c.user_id where w.slug = ${slug} order by c.id`,
  );
  return r.rows;
}

async function pageFor(email?: string, extraCookie?: string) {
  const cookie = [email ? await cookieOf(email) : undefined, extraCookie].filter(Boolean).join("; ") || undefined;
  const r = await settle(() => writeupPage.loader(args(getRequest(`/writeups/${SLUG}`, cookie), { slug: SLUG })));
  expect(r.status).toBe(200);
  return r.data as Awaited<ReturnType<typeof writeupPage.loader>>["data"];
}

describe("comments", () => {
  it("refuses a visitor: 401 in JSON, the sign-in page for a plain form", async () => {
    const r = await postComment({ intent: "post", body: "A visitor's thought." });
    expect(r.status).toBe(401);
    expect((await body(r)).error).toBe("sign-in-needed");
    const plain = await settle(() => commentsApi.action(args(documentRequest(`/api/writeups/${SLUG}/comments`, { intent: "post", body: "A visitor's thought." }), { slug: SLUG })));
    expect(plain.status).toBe(302);
    expect(plain.response!.headers.get("location")).toBe(`/sign-in?redirectTo=${encodeURIComponent(`/writeups/${SLUG}#comment-form`)}`);
    expect(await commentsInDb()).toEqual([]);
  });

  it("stores hostile text as it was typed, and the page renders it as text", async () => {
    const r = await postComment({ intent: "post", body: HOSTILE }, PRIYA);
    expect(r.status).toBe(201);
    const [row] = await commentsInDb();
    expect(row.body).toBe(HOSTILE);

    const page = await pageFor(PRIYA);
    const shown = page.conversation.comments.find((c) => c.id === row.id)!;
    expect(shown).toMatchObject({ body: HOSTILE, authorName: "Priya Dalton", mine: true, canDelete: true });

    // The comments component as the page renders it.
    const Stub = createRoutesStub([
      {
        path: "/writeups/:slug",
        Component: () => createElement(commentsUi.Comments, { slug: SLUG, comments: page.conversation.comments, signedIn: true, draft: null }),
      },
    ]);
    const html = renderToString(createElement(Stub, { initialEntries: [`/writeups/${SLUG}`] }));
    expect(html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(html).toContain("&lt;img src=x onerror=&quot;alert(2)&quot;&gt;");
    expect(html).not.toContain("<script>alert(1)");
    expect(html).not.toMatch(/<img[^>]*onerror/);
  });

  it("keeps comments 2 to 4000 characters, counting a line break once, and says why beside the field", async () => {
    const short = await postComment({ intent: "post", body: "  k \n " }, JOAN);
    expect(short.status).toBe(400);
    expect(await body(short)).toMatchObject({ error: "bad-parameter", parameter: "body", message: "Write at least 2 characters." });

    const long = await postComment({ intent: "post", body: "x".repeat(4001) }, JOAN);
    expect(long.status).toBe(400);
    const longReply = await body(long);
    expect(longReply).toMatchObject({ parameter: "body" });
    expect(String(longReply.message)).toMatch(/4000 characters/);
    // What was typed comes back in the reply, so the form keeps it.
    expect((longReply.result as { initialValue: { body: string } }).initialValue.body).toBe("x".repeat(4001));

    // 4001 characters as a browser sends them (CRLF), 4000 as typed: accepted, stored with one-character line breaks.
    const atLimit = await postComment({ intent: "post", body: `${"y".repeat(1999)}\r\n${"y".repeat(2000)}` }, JOAN);
    expect(atLimit.status).toBe(201);
    const stored = (await commentsInDb()).find((c) => c.email === JOAN)!;
    expect(stored.body).toBe(`${"y".repeat(1999)}\n${"y".repeat(2000)}`);
    expect(stored.body.length).toBe(4000);
  });

  it("refuses a filled honeypot", async () => {
    const before = (await commentsInDb()).length;
    const r = await postComment({ intent: "post", body: "Cheap fenders here", website: "http://spam.example" }, LENA);
    expect(r.status).toBe(400);
    expect((await body(r)).parameter).toBe("website");
    expect((await commentsInDb()).length).toBe(before);
  });

  it("stops a member after 20 comments in an hour and keeps the text", async () => {
    const id = await userId(TOMASZ);
    for (let i = 0; i < 20; i++) {
      expect((await rateLimits.hitLimit(t.db, `comment:account:${id}`, rateLimits.LIMITS.commentPerAccount)).allowed).toBe(true);
    }
    const r = await postComment({ intent: "post", body: "One more thought." }, TOMASZ);
    expect(r.status).toBe(429);
    expect(Number(r.response!.headers.get("retry-after"))).toBeGreaterThan(0);
    const reply = await body(r);
    expect(reply.parameter).toBe("body");
    expect((reply.result as { initialValue: { body: string } }).initialValue.body).toBe("One more thought.");
    expect((await commentsInDb()).some((c) => c.email === TOMASZ)).toBe(false);
  });

  it("answers a plain form with a redirect back: to the new comment, or to the form with the text and the message", async () => {
    const cookie = await cookieOf(LENA);
    const ok = await settle(() => commentsApi.action(args(documentRequest(`/api/writeups/${SLUG}/comments`, { intent: "post", body: "Same box fits hull 318." }, cookie), { slug: SLUG })));
    expect(ok.status).toBe(302);
    const mine = (await commentsInDb()).filter((c) => c.email === LENA);
    expect(ok.response!.headers.get("location")).toBe(`/writeups/${SLUG}#comment-${mine[0].id}`);

    const refused = await settle(() => commentsApi.action(args(documentRequest(`/api/writeups/${SLUG}/comments`, { intent: "post", body: "?" }, cookie), { slug: SLUG })));
    expect(refused.status).toBe(302);
    expect(refused.response!.headers.get("location")).toBe(`/writeups/${SLUG}#comment-form`);
    const draftCookie = cookieFrom(refused.response!);
    const page = await pageFor(undefined, draftCookie);
    expect(page.conversation.draft).toEqual({ body: "?", error: "Write at least 2 characters." });
    expect((await commentsInDb()).filter((c) => c.email === LENA).length).toBe(1);
  });

  it("lists comments oldest first with names, for visitors too", async () => {
    const page = await pageFor();
    const names = page.conversation.comments.map((c) => c.authorName);
    expect(names).toEqual(["Priya Dalton", "Joan Pettifer", "Lena Marchetti"]);
    expect(page.conversation.comments.every((c) => !c.canDelete && !c.mine)).toBe(true);
    expect(page.conversation.signedIn).toBe(false);
  });

  it("lets only the author or a moderator remove a comment", async () => {
    const [priyas] = (await commentsInDb()).filter((c) => c.email === PRIYA);
    const joans = (await commentsInDb()).find((c) => c.email === JOAN)!;

    const visitor = await postComment({ intent: "delete", commentId: String(priyas.id) });
    expect(visitor.status).toBe(401);
    const other = await postComment({ intent: "delete", commentId: String(priyas.id) }, SAM);
    expect(other.status).toBe(403);
    expect((await commentsInDb()).some((c) => c.id === priyas.id)).toBe(true);
    // The page offers removal only where it is allowed.
    const samsView = await pageFor(SAM);
    expect(samsView.conversation.comments.find((c) => c.id === priyas.id)!.canDelete).toBe(false);
    const norasView = await pageFor(NORA);
    expect(norasView.conversation.comments.every((c) => c.canDelete)).toBe(true);

    const own = await postComment({ intent: "delete", commentId: String(priyas.id) }, PRIYA);
    expect(own.status).toBe(200);
    const moderated = await postComment({ intent: "delete", commentId: String(joans.id) }, NORA);
    expect(moderated.status).toBe(200);
    const left = await commentsInDb();
    expect(left.some((c) => c.id === priyas.id || c.id === joans.id)).toBe(false);
    expect(left.length).toBe(1);

    const again = await postComment({ intent: "delete", commentId: String(priyas.id) }, PRIYA);
    expect(again.status).toBe(404);
  });

  it("takes no comment on a write-up that is not published", async () => {
    const r = await postComment({ intent: "post", body: "Looking forward to this one." }, PRIYA, DRAFT_SLUG);
    expect(r.status).toBe(404);
    expect(await commentsInDb(DRAFT_SLUG)).toEqual([]);
  });
});

describe("done on my boat too", () => {
  it("tells an owner whose hull the write-up was not written for, and still lets them count it", async () => {
    // The write-up applies to hulls 120-298 (its seed file); Lena's boat is hull 318 (members.yaml).
    const page = await pageFor(LENA);
    expect(page.conversation.doneToo.appliesTo).toEqual({ from: 120, to: 298 });
    expect(page.conversation.doneToo.mine).toEqual([expect.objectContaining({ hullNumber: 318, state: "open" })]);
    const { DoneToo } = await import("~/components/done-too");
    const Stub = createRoutesStub([{ path: "/writeups/:slug", Component: () => createElement(DoneToo, { slug: SLUG, view: page.conversation.doneToo }) }]);
    const html = renderToString(createElement(Stub, { initialEntries: [`/writeups/${SLUG}`] }));
    expect(html).toContain("This write-up was written for hulls 120–298; hull 318 is not among them.");
    expect(html).toContain("Count my boat too");
    // The author's own hull is within the range: no such note.
    const author = renderToString(createElement(createRoutesStub([{ path: "/writeups/:slug", Component: () => createElement(DoneToo, { slug: SLUG, view: { ...page.conversation.doneToo, mine: [{ hullNumber: 200, name: null, state: "open" }] } }) }]), { initialEntries: [`/writeups/${SLUG}`] }));
    expect(author).not.toContain("is not among them");
  });

  it("counts the author's own boat to begin with", async () => {
    const page = await pageFor();
    expect(page.conversation.doneToo.count).toBe(1);
    expect(page.conversation.doneToo.hulls).toEqual([{ hullNumber: 147, boatName: "Tern Light", isAuthors: true }]);
    expect(page.conversation.doneToo.mine).toBeNull();
  });

  it("refuses a visitor", async () => {
    const r = await postDoneToo({ intent: "record", hullNumber: "356" });
    expect(r.status).toBe(401);
  });

  it("takes only a hull registered to the member", async () => {
    const notMine = await postDoneToo({ intent: "record", hullNumber: "97" }, PRIYA);
    expect(notMine.status).toBe(403);
    expect(await body(notMine)).toMatchObject({ error: "not-your-hull", parameter: "hullNumber" });
    const nonsense = await postDoneToo({ intent: "record", hullNumber: "700" }, PRIYA);
    expect(nonsense.status).toBe(400);
    expect(String((await body(nonsense)).message)).toMatch(/1 to 612/);
    const rows = await t.db.execute(sql`select 1 from done_too d join writeups w on w.id = d.writeup_id where w.slug = ${SLUG}`);
    expect(rows.rows.length).toBe(0);
  });

  it("counts a member's hull once, whichever co-owner records it", async () => {
    const r = await postDoneToo({ intent: "record", hullNumber: "356" }, PRIYA);
    expect(r.status).toBe(201);
    expect(await body(r)).toMatchObject({ ok: true, count: 2 });
    const again = await postDoneToo({ intent: "record", hullNumber: "356" }, SAM);
    expect(again.status).toBe(200);
    expect((await body(again)).count).toBe(2);

    const page = await pageFor(SAM);
    expect(page.conversation.doneToo.count).toBe(2);
    expect(page.conversation.doneToo.hulls.map((h) => [h.hullNumber, h.boatName])).toEqual([[147, "Tern Light"], [356, "Whinchat"]]);
    expect(page.conversation.doneToo.mine).toEqual([{ hullNumber: 356, name: "Whinchat", state: "counted" }]);
  });

  it("does not count the author's boat twice", async () => {
    const r = await postDoneToo({ intent: "record", hullNumber: "147" }, NORA);
    expect(r.status).toBe(400);
    expect(String((await body(r)).message)).toMatch(/counted already/);
    expect((await pageFor(NORA)).conversation.doneToo).toMatchObject({ count: 2, mine: [{ hullNumber: 147, state: "authors" }] });
  });

  it("lets an owner take it back, and nobody else", async () => {
    const stranger = await postDoneToo({ intent: "take-back", hullNumber: "356" }, JOAN);
    expect(stranger.status).toBe(403);
    expect((await pageFor()).conversation.doneToo.count).toBe(2);
    const r = await postDoneToo({ intent: "take-back", hullNumber: "356" }, SAM);
    expect(r.status).toBe(200);
    expect((await body(r)).count).toBe(1);
  });

  it("answers a plain form with a redirect back to the count", async () => {
    const cookie = await cookieOf(JOAN);
    const r = await settle(() => doneTooApi.action(args(documentRequest(`/api/writeups/${SLUG}/done-too`, { intent: "record", hullNumber: "97" }, cookie), { slug: SLUG })));
    expect(r.status).toBe(302);
    expect(r.response!.headers.get("location")).toBe(`/writeups/${SLUG}#done-too`);
    // The session cookie comes back with the notice in it (and Joan still signed in).
    const page = await pageFor(undefined, cookieFrom(r.response!));
    expect(page.conversation.signedIn).toBe(true);
    expect(page.conversation.notice).toBe("Hull 97 is counted. Thank you.");
    expect(page.conversation.doneToo.count).toBe(2);
  });

  it("counts only members' boats when the write-up names none of its own", async () => {
    await t.db.execute(sql`update writeups set boat_id = null where slug = ${SLUG}`);
    const page = await pageFor(NORA);
    expect(page.conversation.doneToo.count).toBe(1);
    expect(page.conversation.doneToo.hulls).toEqual([{ hullNumber: 97, boatName: "Lark Rising", isAuthors: false }]);
    expect(page.conversation.doneToo.mine).toEqual([{ hullNumber: 147, name: "Tern Light", state: "open" }]);
  });

  it("offers a member without a registered boat nothing to choose", async () => {
    await t.db.execute(sql`delete from boat_owners where user_id = (select id from users where email = ${LENA})`);
    expect((await pageFor(LENA)).conversation.doneToo.mine).toEqual([]);
    const r = await postDoneToo({ intent: "record", hullNumber: "318" }, LENA);
    expect(r.status).toBe(403);
  });
});

describe("boat systems (tags) for administrators", () => {
  const add = async (fields: Record<string, string>, email = TOMASZ) =>
    settle(async () => adminTags.action(args(formRequest("/admin/tags", fields, { cookie: await cookieOf(email) }))));
  const errorsOf = (r: { data?: unknown }) => (r.data as { result: { error: Record<string, string[]> } }).result.error;

  it("is for administrators only", async () => {
    const member = await settle(async () => adminTags.loader(args(getRequest("/admin/tags", await cookieOf(PRIYA)))));
    expect(member.status).toBe(403);
    const visitor = await settle(() => adminTags.loader(args(getRequest("/admin/tags"))));
    expect(visitor.status).toBe(302);
    const r = await add({ name: "Ventilation" }, NORA);
    expect(r.status).toBe(403);
  });

  it("lists the systems with their counts", async () => {
    const r = await settle(async () => adminTags.loader(args(getRequest("/admin/tags", await cookieOf(TOMASZ)))));
    const systems = (r.data as { systems: { slug: string; count: number }[] }).systems;
    expect(systems.find((s) => s.slug === "electrical")!.count).toBeGreaterThan(0);
    expect(systems.length).toBe(11); // content-seed/taxonomy.yaml
  });

  it("adds a system with an address made from its name", async () => {
    const r = await add({ name: "Ventilation & heat", description: "Vents, fans, and the cabin heater." });
    expect(r.status).toBe(302);
    const row = await t.db.execute<{ slug: string; name: string; description: string }>(sql`select slug, name, description from systems where slug = 'ventilation-and-heat'`);
    expect(row.rows[0]).toEqual({ slug: "ventilation-and-heat", name: "Ventilation & heat", description: "Vents, fans, and the cabin heater." });
  });

  it("refuses a duplicate name or address with a message beside the field", async () => {
    const sameName = await add({ name: "heel & trim" });
    expect(sameName.status).toBe(400);
    expect(errorsOf(sameName).name[0]).toMatch(/already a system called Heel and trim/);

    const sameSlug = await add({ name: "Wiring", slug: "electrical" });
    expect(sameSlug.status).toBe(400);
    expect(errorsOf(sameSlug).slug[0]).toMatch(/\/systems\/electrical is taken by Electrical/);

    const badSlug = await add({ name: "Canvas work", slug: "canvas work!" });
    expect(badSlug.status).toBe(400);
    expect(errorsOf(badSlug).slug[0]).toMatch(/lower-case letters/);

    const n = await t.db.execute<{ n: number }>(sql`select count(*)::int n from systems`);
    expect(n.rows[0].n).toBe(12);
  });
});
