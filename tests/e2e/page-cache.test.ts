// The public pages kept in memory for visitors who are not signed in (app/services/page-cache.server.ts),
// on a production server of this file's own: what is kept, what never is, that a kept page gets a
// fresh script nonce every time (Content Security Policy Level 3, "nonce" source: a nonce is used
// for one response only), and that a comment shows to the next visitor at once.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { type AppServer, startAppServer } from "../support/app-server";
import { launchBrowser } from "../support/browser";

const SLUG = "group-27-battery-under-starboard-settee";
const CACHE = "x-sistership-page-cache";

let server: AppServer;
let browser: Browser;

beforeAll(async () => {
  [server, browser] = await Promise.all([startAppServer(), launchBrowser()]);
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function visit(path: string, headers: Record<string, string> = {}) {
  const r = await fetch(`${server.baseUrl}${path}`, { headers });
  return { status: r.status, state: r.headers.get(CACHE), policy: r.headers.get("content-security-policy") ?? "", body: await r.text() };
}

const policyNonce = (policy: string) => /'nonce-([^']+)'/.exec(policy)?.[1] ?? null;
const pageNonces = (body: string) => [...new Set([...body.matchAll(/\bnonce="([^"]+)"/g)].map((m) => m[1]))];

describe("a write-up page read by visitors who are not signed in", () => {
  it("is made for the first and kept for the next, each with a nonce of its own", async () => {
    const first = await visit(`/writeups/${SLUG}`);
    const second = await visit(`/writeups/${SLUG}`);
    expect([first.status, second.status]).toEqual([200, 200]);
    expect([first.state, second.state]).toEqual(["miss", "hit"]);
    const [a, b] = [policyNonce(first.policy), policyNonce(second.policy)];
    expect(a).toBeTruthy();
    expect(b).toBeTruthy();
    expect(a).not.toBe(b);
    // Every script of each page carries that page's own nonce, and nothing else changed.
    expect(pageNonces(first.body)).toEqual([a]);
    expect(pageNonces(second.body)).toEqual([b]);
    expect(second.body.replaceAll(b!, a!)).toBe(first.body);
  });

  it("is never kept for a request with a cookie, nor for the data of a client-side navigation", async () => {
    const withCookie = await visit(`/writeups/${SLUG}`, { cookie: "something=1" });
    expect(withCookie.status).toBe(200);
    expect(withCookie.state).toBeNull();
    const data = await fetch(`${server.baseUrl}/writeups/${SLUG}.data`);
    expect(data.status).toBe(200);
    expect(data.headers.get("content-type")).not.toMatch(/text\/html/);
    expect(data.headers.get(CACHE)).toBeNull();
    await data.arrayBuffer();
    // ... and the page kept earlier is still the page, not that data.
    const page = await visit(`/writeups/${SLUG}`);
    expect(page.body).toMatch(/^<!DOCTYPE html>/i);
  });

  it("runs its scripts in the browser when it comes from memory (the policy allows them)", async () => {
    await visit(`/writeups/${SLUG}`);
    const context = await browser.newContext();
    const page = await context.newPage();
    const problems: string[] = [];
    page.on("console", (m) => { if (m.type() === "error") problems.push(m.text()); });
    page.on("pageerror", (e) => problems.push(e.message));
    const response = await page.goto(`${server.baseUrl}/writeups/${SLUG}`);
    expect(response?.headers()[CACHE]).toBe("hit");
    // Hydrated: React Router's client has taken over the page.
    await page.waitForFunction(() => Boolean((window as { __reactRouterRouteModules?: unknown }).__reactRouterRouteModules));
    // A client-side navigation works (it needs the page's scripts).
    await page.getByRole("link", { name: "Spaces", exact: true }).click();
    await page.getByRole("heading", { level: 1, name: "Hidden spaces" }).waitFor();
    expect(problems).toEqual([]);
    await context.close();
  });

  it("shows a new comment to the very next visitor", async () => {
    expect((await visit(`/writeups/${SLUG}`)).state).toBe("hit");
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, "hal.dunmore@example.com", undefined, server.baseUrl);
    const text = `Kept pages check ${Date.now()}: my hull has the same settee front.`;
    const posted = await page.request.post(`${server.baseUrl}/api/writeups/${SLUG}/comments`, {
      form: { intent: "post", body: text },
      headers: { Origin: server.baseUrl, Accept: "application/json" },
    });
    expect(posted.status()).toBe(201);
    await context.close();
    const after = await visit(`/writeups/${SLUG}`);
    expect(after.state).toBe("miss");
    expect(after.body).toContain("my hull has the same settee front.");
  });
});
