// The production build (scripts/serve.mjs) while its PostgreSQL is stopped and after it is started
// again: a 503 page that says what happened and gives back what a form held (never a password),
// JSON 503 on the API, Retry-After on both, /api/health 503, no crash, and the same process
// serving again without a restart.
// Expected behaviour from RFC 9110: §15.6.4 "503 Service Unavailable ... the server is currently
// unable to handle the request due to a temporary overload or scheduled maintenance", and §10.2.3
// Retry-After "how long the user agent ought to wait before making a follow-up request".
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type BenchApp, ensureBenchBuild, startBenchApp } from "../../scripts/lib/bench-app";

let app: BenchApp;
beforeAll(async () => {
  app = await startBenchApp({ buildDir: ensureBenchBuild(), quiet: true });
}, 240_000);
afterAll(async () => {
  await app?.stop();
}, 60_000);

async function get(path: string, init?: RequestInit) {
  const r = await fetch(`${app.baseUrl}${path}`, { ...init, redirect: "manual" });
  return { status: r.status, retryAfter: r.headers.get("retry-after"), type: r.headers.get("content-type") ?? "", text: await r.text() };
}

describe("a database outage", () => {
  it("is answered with 503 pages and JSON, without a crash, and the app serves again once it is back", async () => {
    const slug = /href="\/writeups\/([^"#?]+)"/.exec((await get("/")).text)?.[1];
    expect(slug).toBeTruthy();
    expect((await get(`/writeups/${slug}`)).status).toBe(200);
    const pid = app.server.pid;

    await app.stopDatabase();

    // The page a visitor read a moment ago is still answered from memory (it was kept for visitors
    // without a cookie, docs/decisions/0014-page-cache-for-visitors.md) ...
    const kept = await fetch(`${app.baseUrl}/writeups/${slug}`);
    expect(kept.status).toBe(200);
    expect(kept.headers.get("x-sistership-page-cache")).toBe("hit");
    await kept.text();
    // ... anything that needs the database is told it is not answering.
    const page = await get(`/writeups/${slug}?unit=mm`);
    expect(page.status).toBe(503);
    expect(page.type).toContain("text/html");
    expect(page.retryAfter).toMatch(/^\d+$/);
    expect(page.text).toContain("The database is not answering");
    expect(page.text).toContain("Try again in a minute");
    // In the site's shell (header and footer), not a bare error.
    expect(page.text).toContain('id="main"');

    const api = await get("/api/search?q=battery");
    expect(api.status).toBe(503);
    expect(api.type).toContain("application/json");
    expect(api.retryAfter).toMatch(/^\d+$/);
    expect(JSON.parse(api.text)).toMatchObject({ error: "database-unavailable" });

    // A comment sent by the page's script: the JSON carries what was typed, for the page to give back.
    const comment = await get(`/api/writeups/${slug}/comments`, {
      method: "POST",
      body: new URLSearchParams({ intent: "post", body: "Same fix on my hull, held all season." }),
      headers: { "content-type": "application/x-www-form-urlencoded", origin: app.baseUrl, referer: `${app.baseUrl}/writeups/${slug}` },
    });
    expect(comment.status).toBe(503);
    expect(JSON.parse(comment.text)).toMatchObject({
      error: "database-unavailable",
      posted: true,
      page: `/writeups/${slug}`,
      fields: expect.arrayContaining([{ name: "body", value: "Same fix on my hull, held all season." }]),
    });

    // The fit search reads through a pool of its own; its failure is answered the same way.
    const fit = await get("/api/fit?length=10.2&width=6.8&height=8.7&unit=in");
    expect(fit.status).toBe(503);
    expect(JSON.parse(fit.text)).toMatchObject({ error: "database-unavailable" });

    const health = await get("/api/health");
    expect(health.status).toBe(503);
    expect(JSON.parse(health.text)).toMatchObject({ ok: false, database: "down" });

    // A form sent during the outage: nothing is saved, and what was typed comes back on the page,
    // except the password.
    const form = new URLSearchParams({ email: "outage.test@example.org", displayName: "Outage <b>test</b>", password: "never shown again 123", website: "" });
    const posted = await get("/sign-up", { method: "POST", body: form, headers: { "content-type": "application/x-www-form-urlencoded", origin: app.baseUrl } });
    expect(posted.status).toBe(503);
    expect(posted.text).toContain("nothing you typed was saved");
    expect(posted.text).toContain("outage.test@example.org");
    expect(posted.text).toContain("Outage &lt;b&gt;test&lt;/b&gt;");
    expect(posted.text).not.toContain("never shown again 123");
    expect(posted.text).toContain('action="/sign-up"');
    expect(posted.text).toContain("Passwords are not shown again");

    // Pages that need no database keep working.
    expect((await get("/safety")).status).toBe(200);
    expect(app.serverAlive()).toBe(true);

    await app.startDatabase();

    let healthy = 0;
    for (let i = 0; i < 50 && healthy !== 200; i++) {
      healthy = (await get("/api/health")).status;
      if (healthy !== 200) await new Promise((r) => setTimeout(r, 100));
    }
    expect(healthy).toBe(200);
    expect((await get(`/writeups/${slug}`)).status).toBe(200);
    expect((await get("/api/search?q=battery")).status).toBe(200);
    expect(app.server.pid).toBe(pid);
    expect(app.serverAlive()).toBe(true);
    // The account typed during the outage was not made.
    const client = new (await import("pg")).default.Client({ connectionString: app.databaseUrl });
    await client.connect();
    const made = await client.query("select 1 from users where email = 'outage.test@example.org'");
    await client.end();
    expect(made.rowCount).toBe(0);
  }, 120_000);
});
