// Every page of the app checked with axe-core (the Deque engine that implements the WCAG 2.x success
// criteria as rules) in Chromium, as the user who would see it: no serious or critical violation.
// The pages come from app/routes.ts: a page route (a module with a default export) with no case
// below fails the test, so a new page cannot slip past the check.
import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import routes from "~/routes";
import { type AppServer, startAppServer } from "../support/app-server";
import { signInAs } from "../support/auth";
import { launchBrowser, screenshotPath } from "../support/browser";

const AXE = createRequire(import.meta.url).resolve("axe-core/axe.min.js");
const APP = path.resolve(import.meta.dirname, "../../app");

type Who = "visitor" | "member" | "moderator" | "admin" | "secretary";
const PEOPLE: Record<Exclude<Who, "visitor">, string> = {
  member: "hal.dunmore@example.com",
  moderator: "nora.pelling@example.org",
  admin: "tomasz.wren@example.org",
  secretary: "ruth.ambler@example.org",
};

// One case per page route: the address to open and who opens it; or why it is not checked.
type Case = { url: string | (() => Promise<string>); as: Who; status?: number } | { skip: string };
const CASES: Record<string, Case[]> = {
  "/": [{ url: "/", as: "visitor" }, { url: "/", as: "member" }],
  "writeups/:slug": [{ url: "/writeups/group-27-battery-under-starboard-settee", as: "visitor" }],
  "systems/:slug": [{ url: "/systems/electrical", as: "visitor" }],
  search: [{ url: "/search?q=battery+box+under+the+settee", as: "visitor" }, { url: "/search?q=chianplates", as: "visitor" }],
  safety: [{ url: "/safety", as: "visitor" }],
  "sign-in": [{ url: "/sign-in", as: "visitor" }],
  "sign-up": [{ url: "/sign-up", as: "visitor" }],
  "verify-email": [{ url: "/verify-email?token=not-a-token", as: "visitor" }],
  "forgot-password": [{ url: "/forgot-password", as: "visitor" }],
  "reset-password": [{ url: "/reset-password?token=not-a-token", as: "visitor" }],
  account: [{ url: "/account", as: "member" }],
  "admin/users": [{ url: "/admin/users", as: "admin" }],
  "dev/mail": [{ skip: "development only: the production build answers 404 (the not-found page is checked)" }],
  "my/writeups": [{ url: "/my/writeups", as: "member" }],
  "my/writeups/:id": [{ url: "/my/writeups/new", as: "member" }],
  review: [{ url: "/review", as: "moderator" }],
  "review/:revisionId": [{ url: () => waitingRevision(), as: "moderator" }],
  "admin/tags": [{ url: "/admin/tags", as: "admin" }],
  spaces: [{ url: "/spaces", as: "visitor" }],
  "spaces/:slug": [{ url: "/spaces/starboard-settee-aft-late-mk1", as: "member" }],
  fit: [{ url: "/fit?item=bci-group-31&clearance=1/2", as: "visitor" }],
  items: [{ url: "/items", as: "visitor" }],
  "boats/:hull": [{ url: "/boats/147", as: "moderator" }, { url: "/boats/147", as: "visitor" }],
  "admin/class": [{ url: "/admin/class", as: "admin" }],
  "tools/heel": [{ url: "/tools/heel", as: "visitor" }],
  "tools/cable": [{ url: "/tools/cable", as: "visitor" }],
  "*": [{ url: "/no-such-page", as: "visitor", status: 404 }],
  // The yearly digest: 2025 issued and 2024 compiled as a draft before the checks (beforeAll).
  digest: [{ url: "/digest", as: "visitor" }],
  "digest/unsubscribe": [{ url: "/digest/unsubscribe?token=not-a-token", as: "visitor", status: 400 }],
  "digest/:year": [{ url: "/digest/2025", as: "visitor" }],
  "secretary/digest": [{ url: "/secretary/digest", as: "secretary" }],
  "secretary/digest/:year": [{ url: "/secretary/digest/2024", as: "secretary" }],
  "secretary/digest/:year/preview": [{ url: "/secretary/digest/2024/preview", as: "secretary" }],
};

type RouteEntry = { path?: string; index?: boolean; file: string; children?: RouteEntry[] };
function pageRoutes(list: RouteEntry[]): string[] {
  return list.flatMap((r) => {
    const source = fs.readFileSync(path.join(APP, r.file), "utf8");
    const isPage = /export default/.test(source);
    return [...(isPage ? [r.index ? "/" : r.path ?? ""] : []), ...pageRoutes(r.children ?? [])];
  });
}

async function waitingRevision(): Promise<string> {
  const r = await server.database.pool.query(
    `select r.id from writeup_revisions r join users u on u.id = r.author_id
     where r.status = 'awaiting_review' and u.email <> $1 order by r.id limit 1`, [PEOPLE.moderator]);
  if (!r.rows.length) throw new Error("no revision is waiting for review in the demo content");
  return `/review/${r.rows[0].id}`;
}

/** Posts a form as the page's user, as the page itself would (same origin). */
async function post(page: Page, path: string, form: Record<string, string>): Promise<number> {
  const r = await page.request.post(`${server.baseUrl}${path}`, { form, headers: { Origin: server.baseUrl }, maxRedirects: 0 });
  return r.status();
}

type Violation = { id: string; impact: string; help: string; nodes: { target: string[]; failureSummary?: string }[] };
async function axeViolations(page: Page): Promise<Violation[]> {
  await page.addScriptTag({ path: AXE });
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: Violation[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ["violations"] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
}

let server: AppServer;
let browser: Browser;
const contexts = new Map<Who, { context: BrowserContext; page: Page }>();
async function pageAs(who: Who): Promise<Page> {
  const known = contexts.get(who);
  if (known) return known.page;
  // bypassCSP: the page's Content-Security-Policy would refuse the injected axe-core script.
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, bypassCSP: true });
  const page = await context.newPage();
  if (who !== "visitor") await signInAs(page, PEOPLE[who], undefined, server.baseUrl);
  contexts.set(who, { context, page });
  return page;
}

// A server and database of this file's own: the digest is compiled and issued here, and no page
// depends on what other files did.
beforeAll(async () => {
  [server, browser] = await Promise.all([startAppServer(), launchBrowser()]);
  const secretary = await pageAs("secretary");
  expect(await post(secretary, "/secretary/digest", { year: "2025" })).toBe(302);
  expect(await post(secretary, "/secretary/digest/2025/preview", { confirm: "on" })).toBe(302);
  expect(await post(secretary, "/secretary/digest", { year: "2024" })).toBe(302);
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("accessibility (axe-core)", () => {
  const paths = pageRoutes(routes as RouteEntry[]);

  it("has a case for every page in app/routes.ts", () => {
    expect(paths.length).toBeGreaterThan(20);
    expect(paths.filter((p) => !(p in CASES))).toEqual([]);
    expect(Object.keys(CASES).filter((p) => !paths.includes(p))).toEqual([]);
  });

  for (const [route, cases] of Object.entries(CASES)) {
    for (const c of cases) {
      if ("skip" in c) {
        it.skip(`${route}: ${c.skip}`, () => {});
        continue;
      }
      it(`${route} as ${c.as}: no serious or critical violation`, async () => {
        const page = await pageAs(c.as);
        const url = typeof c.url === "string" ? c.url : await c.url();
        const response = await page.goto(`${server.baseUrl}${url}`);
        expect(response?.status(), url).toBe(c.status ?? 200);
        await page.locator("h1").first().waitFor();
        await page.waitForLoadState("networkidle");
        const violations = (await axeViolations(page)).filter((v) => v.impact === "serious" || v.impact === "critical");
        if (violations.length) {
          await page.screenshot({ path: screenshotPath(`a11y-${route.replace(/[^a-z0-9]+/gi, "-")}-${c.as}`), fullPage: true });
        }
        const described = violations.map((v) => `${v.impact} ${v.id}: ${v.help}\n${v.nodes.slice(0, 5).map((n) => `    ${n.target.join(" ")} ${n.failureSummary?.split("\n").slice(1, 2).join("") ?? ""}`).join("\n")}`);
        expect(described, url).toEqual([]);
      });
    }
  }
});
