// Benchmark of the pages themselves, on the production build (scripts/serve.mjs, one process) with
// the demo content:
//   - first-load JavaScript of the home page and of a write-up page: every script the page loads
//     before it is interactive (its <script> and <link rel="modulepreload"> assets, and what its
//     inline module script imports), as the browser downloads them (gzip, from the server), in kB
//     of 1000 bytes. Target: at most 120 kB each.
//   - a write-up page's throughput for one server process with autocannon: requests per second
//     and p99 latency at --connections (default 10) for --seconds (default 20), after a warm-up.
//     Targets: at least 500 requests per second, p99 at most 50 ms. Read by visitors who are not
//     signed in (kept in memory after the first, docs/decisions/0014-page-cache-for-visitors.md),
//     and, without a target, by a signed-in member, for whom every page is made afresh.
//
//   npx tsx scripts/bench-pages.ts [--connections=10] [--seconds=20]
//
// The load generator runs on the same machine as the server (and its database), so it takes part
// of the same cores: the figures are a floor for a server of its own.
import http from "node:http";
import autocannon from "autocannon";
import pg from "pg";
import { argNumber, figure } from "./lib/bench-kit";
import { ensureBenchBuild, startBenchApp } from "./lib/bench-app";
import { DEMO_PASSWORD } from "./seed-content";

const CONNECTIONS = argNumber("connections", 10);
const SECONDS = argNumber("seconds", 20);
const KB = 1000;

/** The bytes of a response body as sent on the wire (compressed when the server compresses). */
function wireBytes(url: string): Promise<{ status: number; bytes: number; encoding: string }> {
  return new Promise((resolve, reject) => {
    http.get(url, { headers: { "accept-encoding": "gzip" } }, (res) => {
      let bytes = 0;
      res.on("data", (c: Buffer) => (bytes += c.length));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, bytes, encoding: String(res.headers["content-encoding"] ?? "identity") }));
      res.on("error", reject);
    }).on("error", reject);
  });
}

/** The script URLs a page loads at first: <script src>, modulepreload links, and inline imports. */
export function firstLoadScripts(html: string): string[] {
  const found = new Set<string>();
  for (const m of html.matchAll(/<link\b[^>]*\brel="modulepreload"[^>]*>/g)) {
    const href = /\bhref="([^"]+)"/.exec(m[0])?.[1];
    if (href) found.add(href);
  }
  for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)) {
    const src = /\bsrc="([^"]+)"/.exec(m[1])?.[1];
    if (src) found.add(src);
    if (/type="module"/.test(m[1])) {
      for (const i of m[2].matchAll(/import\s*(?:[^"'()]*?from\s*)?["']([^"']+\.js)["']/g)) found.add(i[1]);
      for (const i of m[2].matchAll(/import\(\s*["']([^"']+\.js)["']\s*\)/g)) found.add(i[1]);
    }
  }
  return [...found];
}

async function firstLoadKb(baseUrl: string, pathname: string): Promise<{ kb: number; files: number }> {
  const res = await fetch(`${baseUrl}${pathname}`);
  if (!res.ok) throw new Error(`${pathname} answered ${res.status}`);
  const scripts = firstLoadScripts(await res.text());
  if (!scripts.length) throw new Error(`${pathname} loads no script: the page markup changed, or hydration is off`);
  let bytes = 0;
  for (const src of scripts) {
    const r = await wireBytes(new URL(src, baseUrl).toString());
    if (r.status !== 200) throw new Error(`${src} answered ${r.status}`);
    bytes += r.bytes;
  }
  console.log(`  ${pathname}: ${scripts.length} scripts, ${(bytes / KB).toFixed(1)} kB as sent`);
  return { kb: bytes / KB, files: scripts.length };
}

function load(url: string, seconds: number, connections: number, headers: Record<string, string> = {}): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon({ url, connections, duration: seconds, timeout: 10, headers }, (error, result) => (error ? reject(error) : resolve(result)));
  });
}

/** The session cookie of a demo member, signed in through the sign-in form. */
async function signIn(baseUrl: string, email: string): Promise<string> {
  const res = await fetch(`${baseUrl}/sign-in`, {
    method: "POST",
    redirect: "manual",
    headers: { Origin: baseUrl, "Content-Type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email, password: DEMO_PASSWORD, redirectTo: "/" }),
  });
  const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  if (res.status !== 302 || !cookie) throw new Error(`signing in as ${email} answered ${res.status}`);
  return cookie;
}

const buildDir = ensureBenchBuild();
const app = await startBenchApp({ buildDir, quiet: true });
try {
  const client = new pg.Client({ connectionString: app.databaseUrl });
  await client.connect();
  const { rows } = await client.query<{ slug: string }>(
    "select slug from writeups where status = 'published' order by length(body_markdown) desc, id limit 1",
  );
  await client.end();
  if (!rows.length) throw new Error("the demo content has no published write-up");
  const writeup = `/writeups/${rows[0].slug}`;

  console.log("First-load JavaScript (gzip as served):");
  const home = await firstLoadKb(app.baseUrl, "/");
  const page = await firstLoadKb(app.baseUrl, writeup);
  figure("pages: first-load JS, home page", home.kb, "kB gzip", { op: "<=", value: 120 });
  figure("pages: first-load JS, write-up page", page.kb, "kB gzip", { op: "<=", value: 120 });

  console.log(`Write-up page ${writeup}, read by visitors: warm-up 3 s, then ${SECONDS} s at ${CONNECTIONS} connections ...`);
  await load(`${app.baseUrl}${writeup}`, 3, CONNECTIONS);
  const r = await load(`${app.baseUrl}${writeup}`, SECONDS, CONNECTIONS);
  console.log(`  ${r.requests.total} requests, ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
  figure(`pages: write-up page, one process, ${CONNECTIONS} connections: requests per second`, r.requests.average, "req/s", { op: ">=", value: 500 });
  figure(`pages: write-up page, one process, ${CONNECTIONS} connections: p50 latency`, r.latency.p50, "ms");
  figure(`pages: write-up page, one process, ${CONNECTIONS} connections: p99 latency`, r.latency.p99, "ms", { op: "<=", value: 50 });
  figure("pages: write-up page: errors and non-2xx answers", r.errors + r.timeouts + r.non2xx, "count", { op: "<=", value: 0 });

  const cookie = await signIn(app.baseUrl, "hal.dunmore@example.com");
  console.log(`Write-up page ${writeup}, read by a signed-in member (made every time): ${SECONDS} s at ${CONNECTIONS} connections ...`);
  await load(`${app.baseUrl}${writeup}`, 3, CONNECTIONS, { cookie });
  const m = await load(`${app.baseUrl}${writeup}`, SECONDS, CONNECTIONS, { cookie });
  console.log(`  ${m.requests.total} requests, ${m.non2xx} non-2xx, ${m.errors} errors, ${m.timeouts} timeouts`);
  figure(`pages: write-up page for a signed-in member, one process, ${CONNECTIONS} connections: requests per second`, m.requests.average, "req/s");
  figure(`pages: write-up page for a signed-in member, one process, ${CONNECTIONS} connections: p99 latency`, m.latency.p99, "ms");
  figure("pages: write-up page for a signed-in member: errors and non-2xx answers", m.errors + m.timeouts + m.non2xx, "count", { op: "<=", value: 0 });
} finally {
  await app.stop();
}
