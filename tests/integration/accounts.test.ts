import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let signUp: typeof import("~/routes/sign-up");
let signIn: typeof import("~/routes/sign-in");
let verify: typeof import("~/routes/verify-email");
let forgot: typeof import("~/routes/forgot-password");
let reset: typeof import("~/routes/reset-password");
let account: typeof import("~/routes/account");
let adminUsers: typeof import("~/routes/admin.users");
let session: typeof import("~/services/session.server");
let DEMO_PASSWORD: string;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [signUp, signIn, verify, forgot, reset, account, adminUsers, session] = await Promise.all([
    import("~/routes/sign-up"), import("~/routes/sign-in"), import("~/routes/verify-email"),
    import("~/routes/forgot-password"), import("~/routes/reset-password"), import("~/routes/account"),
    import("~/routes/admin.users"), import("~/services/session.server"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
});
afterAll(async () => t?.drop());

const args = (request: Request) => ({ request, params: {}, context: {} }) as never;

async function outboxTo(address: string) {
  const r = await t.db.execute<{ subject: string; text_body: string }>(sql`select subject, text_body from outbox where to_address = ${address} order by id`);
  return r.rows;
}
const linkIn = (text: string, path: string) => {
  const m = new RegExp(`https?://[^\\s]+${path}\\?token=([A-Za-z0-9_-]+)`).exec(text);
  if (!m) throw new Error(`no ${path} link in: ${text}`);
  return m[1];
};

async function signInAs(email: string, password = DEMO_PASSWORD) {
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  return cookieFrom(r.response!);
}

describe("sign-up", () => {
  it("refuses a weak password with a message beside the field and keeps the other values", async () => {
    const r = await settle(() => signUp.action(args(formRequest("/sign-up", { email: "new.owner@example.org", displayName: "New Owner", password: "password123" }))));
    expect(r.status).toBe(400);
    const result = (r.data as { result: { error: Record<string, string[]>; initialValue: Record<string, string> } }).result;
    expect(result.error.password[0]).toMatch(/most common/);
    expect(result.initialValue.email).toBe("new.owner@example.org");
    expect(result.initialValue.password).toBeUndefined(); // never echoed back
  });

  it("refuses a filled honeypot", async () => {
    const r = await settle(() => signUp.action(args(formRequest("/sign-up", { email: "bot@example.org", displayName: "Bot", password: "long enough passphrase", website: "http://spam.example" }))));
    expect(r.status).toBe(400);
    const n = await t.db.execute<{ n: number }>(sql`select count(*)::int n from users where email = 'bot@example.org'`);
    expect(n.rows[0].n).toBe(0);
  });

  it("makes an unverified member, signs them in and queues a verification link that works once", async () => {
    const r = await settle(() => signUp.action(args(formRequest("/sign-up", { email: "Fern.Okafor@Example.org", displayName: "Fern Okafor", password: "tiller and two shackles" }))));
    expect(r.status).toBe(302);
    expect(r.response!.headers.get("location")).toBe("/account");
    const cookie = cookieFrom(r.response!);
    const user = await session.getUser(getRequest("/account", cookie));
    expect(user).toMatchObject({ email: "fern.okafor@example.org", emailVerified: false, roles: ["member"] });

    const [mail] = await outboxTo("fern.okafor@example.org");
    expect(mail.subject).toMatch(/Confirm your e-mail/);
    const token = linkIn(mail.text_body, "/verify-email");
    // Opening the link (GET) changes nothing.
    const page = await verify.loader(args(getRequest(`/verify-email?token=${token}`)));
    expect(page.valid).toBe(true);
    expect((await session.getUser(getRequest("/", cookie)))!.emailVerified).toBe(false);
    const confirmed = await settle(() => verify.action(args(formRequest("/verify-email", { token }, { cookie }))));
    expect(confirmed.status).toBe(302);
    expect((await session.getUser(getRequest("/", cookie)))!.emailVerified).toBe(true);
    const again = await settle(() => verify.action(args(formRequest("/verify-email", { token }, { cookie }))));
    expect(again.status).toBe(400);
  });

  it("refuses a second account for the same address", async () => {
    const r = await settle(() => signUp.action(args(formRequest("/sign-up", { email: "fern.okafor@example.org", displayName: "Someone Else", password: "another long passphrase" }))));
    expect(r.status).toBe(400);
    expect(JSON.stringify(r.data)).toMatch(/already exists/);
  });
});

describe("sign-in", () => {
  it("gives the same answer for a wrong password and an unknown address", async () => {
    const wrong = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "nora.pelling@example.org", password: "not the password at all" }, { address: "203.0.113.1" }))));
    const unknown = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "nobody.here@example.org", password: "not the password at all" }, { address: "203.0.113.1" }))));
    expect(wrong.status).toBe(400);
    expect(unknown.status).toBe(400);
    const message = (x: typeof wrong) => (x.data as { result: { error: Record<string, string[]> } }).result.error[""];
    expect(message(wrong)).toEqual(message(unknown));
  });

  it("signs in a demo member and comes back to the page asked for, never to another site", async () => {
    const ok = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "nora.pelling@example.org", password: DEMO_PASSWORD, redirectTo: "/account" }))));
    expect(ok.response!.headers.get("location")).toBe("/account");
    const evil = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "nora.pelling@example.org", password: DEMO_PASSWORD, redirectTo: "//evil.example/x" }))));
    expect(evil.response!.headers.get("location")).toBe("/");
  });

  it("limits failed attempts per account with a 429 and a clear message (the right password too, while locked)", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 10; i++) {
      // A different address each time: the per-account limit must hold on its own.
      const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "hal.dunmore@example.com", password: "wrong guess number " + i }, { address: `192.0.2.${i + 1}` }))));
      statuses.push(r.status);
    }
    expect(statuses.slice(0, 8).every((s) => s === 400)).toBe(true);
    expect(statuses.slice(8)).toEqual([429, 429]);
    const blocked = await settle(() => signIn.action(args(formRequest("/sign-in", { email: "hal.dunmore@example.com", password: DEMO_PASSWORD }, { address: "192.0.2.99" }))));
    expect(blocked.status).toBe(429);
    expect(JSON.stringify(blocked.data)).toMatch(/Too many sign-in attempts/);
  });
});

describe("password reset", () => {
  it("answers the same for a known and an unknown address, and mails only the known one", async () => {
    const known = await settle(() => forgot.action(args(formRequest("/forgot-password", { email: "joan.pettifer@example.org" }))));
    const unknown = await settle(() => forgot.action(args(formRequest("/forgot-password", { email: "not.a.member@example.org" }))));
    expect(known.status).toBe(unknown.status);
    expect((known.data as { sent: boolean }).sent).toBe(true);
    expect((unknown.data as { sent: boolean }).sent).toBe(true);
    expect(await outboxTo("not.a.member@example.org")).toHaveLength(0);
    expect(await outboxTo("joan.pettifer@example.org")).toHaveLength(1);
  });

  it("a reset link works once, changes the password and signs out other browsers", async () => {
    const oldCookie = await signInAs("joan.pettifer@example.org");
    const [mail] = await outboxTo("joan.pettifer@example.org");
    const token = linkIn(mail.text_body, "/reset-password");
    const mismatch = await settle(() => reset.action(args(formRequest("/reset-password", { token, password: "mooring lines at dawn", confirm: "mooring lines at dusk" }))));
    expect(mismatch.status).toBe(400);
    const ok = await settle(() => reset.action(args(formRequest("/reset-password", { token, password: "mooring lines at dawn", confirm: "mooring lines at dawn" }))));
    expect(ok.status).toBe(302);
    expect(await session.getUser(getRequest("/", oldCookie))).toBeNull();
    await signInAs("joan.pettifer@example.org", "mooring lines at dawn");
    const reuse = await settle(() => reset.action(args(formRequest("/reset-password", { token, password: "another new passphrase", confirm: "another new passphrase" }))));
    expect(reuse.status).toBe(400);
  });

  it("an expired reset link does not work", async () => {
    await forgot.action(args(formRequest("/forgot-password", { email: "sam.hurrell@example.com" })));
    const [mail] = await outboxTo("sam.hurrell@example.com");
    const token = linkIn(mail.text_body, "/reset-password");
    await t.db.execute(sql`update auth_tokens set expires_at = now() - interval '1 minute' where kind = 'reset_password'`);
    expect((await reset.loader(args(getRequest(`/reset-password?token=${token}`)))).valid).toBe(false);
    const r = await settle(() => reset.action(args(formRequest("/reset-password", { token, password: "mooring lines at dawn", confirm: "mooring lines at dawn" }))));
    expect(r.status).toBe(400);
  });
});

describe("boats and roles", () => {
  it("registers a boat by hull number, with a clear message for a number outside the class", async () => {
    const cookie = await signInAs("lena.marchetti@example.com");
    for (const bad of ["0", "613", "abc", "12.5"]) {
      const r = await settle(() => account.action(args(formRequest("/account", { intent: "add-boat", hullNumber: bad }, { cookie }))));
      expect(r.status).toBe(400);
      expect(JSON.stringify(r.data)).toMatch(/hull number/i);
    }
    const ok = await settle(() => account.action(args(formRequest("/account", { intent: "add-boat", hullNumber: "356", boatName: "" }, { cookie }))));
    expect(ok.status).toBe(302);
    // Hull 356 was already registered by two co-owners in the demo: Lena joins them, the name stays.
    const page = await settle(() => account.loader(args(getRequest("/account", cookie))));
    const boats = (page.data as { boats: { hullNumber: number; variant: string; name: string | null; owners: unknown[] }[] }).boats;
    const b356 = boats.find((b) => b.hullNumber === 356)!;
    expect(b356.variant).toBe("Mk II");
    expect(b356.owners.length).toBe(3);
  });

  it("keeps the members' table for administrators: sign-in for visitors, 403 for members", async () => {
    const anonymous = await settle(() => adminUsers.loader(args(getRequest("/admin/users"))));
    expect(anonymous.status).toBe(302);
    expect(anonymous.response!.headers.get("location")).toBe("/sign-in?redirectTo=%2Fadmin%2Fusers");
    const member = await signInAs("eddie.marchbank@example.org");
    expect((await settle(() => adminUsers.loader(args(getRequest("/admin/users", member))))).status).toBe(403);
    const admin = await signInAs("tomasz.wren@example.org");
    const page = await settle(() => adminUsers.loader(args(getRequest("/admin/users?role=moderator", admin))));
    const rows = (page.data as { rows: { email: string; roles: string[]; hulls: number[] }[] }).rows;
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.roles.includes("moderator"))).toBe(true);
    // Each row lists that member's own hulls (members.yaml: Nora Pelling owns hull 147 only).
    expect(rows.find((r) => r.email === "nora.pelling@example.org")?.hulls).toEqual([147]);
  });

  it("lets an administrator give a role, which then opens the page it guards", async () => {
    const admin = await signInAs("tomasz.wren@example.org");
    const r = await t.db.execute<{ id: number }>(sql`select id from users where email = 'eddie.marchbank@example.org'`);
    const saved = await settle(() => adminUsers.action(args(formRequest("/admin/users", { userId: String(r.rows[0].id), roles: ["admin"] }, { cookie: admin }))));
    expect(saved.status).toBe(302);
    const eddie = await signInAs("eddie.marchbank@example.org");
    expect((await settle(() => adminUsers.loader(args(getRequest("/admin/users", eddie))))).status).toBe(200);
  });

  it("signs out every other browser on request", async () => {
    const first = await signInAs("marisol.ferrante@example.org");
    const second = await signInAs("marisol.ferrante@example.org");
    const r = await settle(() => account.action(args(formRequest("/account", { intent: "sign-out-others" }, { cookie: second }))));
    expect(r.status).toBe(302);
    expect(await session.getUser(getRequest("/", first))).toBeNull();
    expect(await session.getUser(getRequest("/", second))).not.toBeNull();
  });
});
