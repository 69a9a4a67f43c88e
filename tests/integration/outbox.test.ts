// The outbox against a real PostgreSQL and a real SMTP server (the stand-in, in this process).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as s from "~/db/schema";
import {
  deliverPending, enqueueEmail, GIVE_UP_AFTER_MS, listOutbox, retryDelayMs, type Send,
} from "~/models/outbox.server";
import { createMailSender } from "~/services/email.server";
import { startSmtpStandin } from "../../scripts/smtp-standin-server";
import { createTestDatabase } from "../support/db";
import { extractLinks, readMailbox, waitForMail } from "../support/mailbox";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let standin: Awaited<ReturnType<typeof startSmtpStandin>>;
let dir: string;
let send: Send;

beforeAll(async () => {
  t = await createTestDatabase("template_empty");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-outbox-mail-"));
  standin = await startSmtpStandin({ port: 0, dir });
  send = createMailSender({ host: "127.0.0.1", port: standin.port, from: "Sistership <no-reply@sistership.example>" });
});
afterAll(async () => {
  await standin?.close();
  await t?.drop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

const received = (subject: string) => readMailbox(dir).filter((m) => m.subject === subject);

/** Runs `body` with the SMTP server stopped, then starts it again on the same port, whatever happens. */
async function whileServerDown(body: () => Promise<void>) {
  const port = standin.port;
  await standin.close();
  try {
    await body();
  } finally {
    standin = await startSmtpStandin({ port, dir });
  }
}
const row = async (id: number) => (await t.db.select().from(s.outbox).where(eq(s.outbox.id, id)))[0];

describe("the e-mail outbox", () => {
  it("delivers an enqueued message over SMTP, with its recipient, subject and bodies", async () => {
    const id = await enqueueEmail(t.db, {
      to: "hull17@example.org",
      subject: "Confirm your address",
      text: "Open https://sistership.example/verify?token=abc123 to confirm.\n",
      html: "<p>Open <a href=\"https://sistership.example/verify?token=abc123\">this link</a>.</p>",
      kind: "verify-email",
    });
    const now = new Date();
    expect(await deliverPending(t.db, send, { now })).toEqual({ sent: 1, failed: 0 });

    // The stand-in answers 250 only once it has kept the message (RFC 5321 §4.1.1.4): no waiting.
    const [mail] = received("Confirm your address");
    expect(mail.to).toEqual(["hull17@example.org"]);
    expect(mail.from).toMatch(/^"?Sistership"? <no-reply@sistership\.example>$/);
    expect(mail.text.trim()).toBe("Open https://sistership.example/verify?token=abc123 to confirm.");
    expect(mail.html).toContain("href=\"https://sistership.example/verify?token=abc123\"");
    expect(extractLinks(mail.text)).toEqual(["https://sistership.example/verify?token=abc123"]);
    expect(await waitForMail(dir, (m) => m.to.includes("hull17@example.org"), 1000)).toEqual(mail);

    const stored = await row(id);
    expect(stored.sentAt?.getTime()).toBe(now.getTime());
    expect(stored.attempts).toBe(0);
    // Sent once: a later run finds nothing due.
    expect(await deliverPending(t.db, send, { now: new Date(now.getTime() + 60_000) })).toEqual({ sent: 0, failed: 0 });
    expect(received("Confirm your address")).toHaveLength(1);
  });

  it("commits a message with the transaction that queued it, and drops it when that rolls back", async () => {
    await t.db
      .transaction(async (tx) => {
        await enqueueEmail(tx, { to: "hull18@example.org", subject: "Never sent", text: "x", kind: "verify-email" });
        tx.rollback();
      })
      .catch(() => {});
    const rows = await t.db.select().from(s.outbox).where(eq(s.outbox.subject, "Never sent"));
    expect(rows).toHaveLength(0);
  });

  it("keeps a message while the SMTP server is down, retries it later, and sends it exactly once", async () => {
    const id = await enqueueEmail(t.db, {
      to: "hull21@example.org", subject: "Reset your password", text: "Open the link.", kind: "password-reset",
    });
    const t0 = new Date();
    await whileServerDown(async () => {
      expect(await deliverPending(t.db, send, { now: t0 })).toEqual({ sent: 0, failed: 1 });
    });

    const failed = await row(id);
    expect(failed.sentAt).toBeNull();
    expect(failed.attempts).toBe(1);
    // Nothing listens on the port: the connection is refused.
    expect(failed.lastError).toMatch(/ECONNREFUSED/);
    expect(failed.nextAttemptAt.getTime()).toBe(t0.getTime() + retryDelayMs(1));
    expect(failed.nextAttemptAt.getTime()).toBeGreaterThan(t0.getTime());
    expect((await listOutbox(t.db, { now: t0 })).find((m) => m.id === id)).toMatchObject({ status: "retrying", attempts: 1 });
    // Back up, but not yet due: nothing is sent before the next attempt's time.
    expect(await deliverPending(t.db, send, { now: new Date(t0.getTime() + 1_000) })).toEqual({ sent: 0, failed: 0 });
    expect(received("Reset your password")).toHaveLength(0);

    const later = new Date(t0.getTime() + retryDelayMs(1) + 1_000);
    expect(await deliverPending(t.db, send, { now: later })).toEqual({ sent: 1, failed: 0 });
    expect(await deliverPending(t.db, send, { now: new Date(later.getTime() + 3_600_000) })).toEqual({ sent: 0, failed: 0 });
    expect(received("Reset your password").map((m) => m.to)).toEqual([["hull21@example.org"]]);
    const sent = await row(id);
    expect(sent.sentAt?.getTime()).toBe(later.getTime());
    expect(sent.attempts).toBe(1);
  });

  it("lets two senders at once deliver every message exactly once", async () => {
    const subjects = Array.from({ length: 16 }, (_, i) => `Moderation notice ${i + 1}`);
    for (const subject of subjects) {
      await enqueueEmail(t.db, { to: "moderators@example.org", subject, text: "A write-up awaits review.", kind: "moderation" });
    }
    // A slow server, so that the two senders overlap for the whole run.
    const used: string[] = [];
    const slowSend = (name: string): Send => async (mail) => {
      await new Promise((r) => setTimeout(r, 25));
      used.push(name);
      return send(mail);
    };
    const now = new Date(Date.now() + 1_000);
    const [a, b] = await Promise.all([
      deliverPending(t.db, slowSend("a"), { limit: 20, now }),
      deliverPending(t.db, slowSend("b"), { limit: 20, now }),
    ]);
    expect(a.sent + b.sent).toBe(subjects.length);
    expect(a.failed + b.failed).toBe(0);
    // Both took part (else this would not test concurrency at all).
    expect(new Set(used)).toEqual(new Set(["a", "b"]));
    for (const subject of subjects) expect({ subject, copies: received(subject).length }).toEqual({ subject, copies: 1 });
  });

  it("sends at most `limit` messages per run and the rest on the next", async () => {
    for (const n of [1, 2, 3]) {
      await enqueueEmail(t.db, { to: `owner${n}@example.org`, subject: `Digest ${n}`, text: "The year's write-ups.", kind: "digest" });
    }
    const now = new Date(Date.now() + 1_000);
    expect(await deliverPending(t.db, send, { limit: 2, now })).toEqual({ sent: 2, failed: 0 });
    expect(await deliverPending(t.db, send, { limit: 2, now })).toEqual({ sent: 1, failed: 0 });
    expect([1, 2, 3].map((n) => received(`Digest ${n}`).length)).toEqual([1, 1, 1]);
  });

  it("stops trying a message once it is older than the give-up time, and keeps it for the admin", async () => {
    const id = await enqueueEmail(t.db, { to: "hull30@example.org", subject: "Old notice", text: "x", kind: "moderation" });
    const created = (await row(id)).createdAt;
    await whileServerDown(async () => {
      expect(await deliverPending(t.db, send, { now: new Date(created.getTime() + 1_000) })).toEqual({ sent: 0, failed: 1 });
    });
    const tooLate = new Date(created.getTime() + GIVE_UP_AFTER_MS + 1_000);
    expect(await deliverPending(t.db, send, { now: tooLate })).toEqual({ sent: 0, failed: 0 });
    expect(received("Old notice")).toHaveLength(0);
    const listed = (await listOutbox(t.db, { now: tooLate })).find((m) => m.id === id);
    expect(listed).toMatchObject({ status: "given up", attempts: 1, sentAt: null });
    expect(listed?.lastError).toMatch(/ECONNREFUSED/);
    // The admin's list does not carry bodies (they hold sign-in links).
    expect(listed).not.toHaveProperty("textBody");
  });

  it("refuses a message without a valid recipient before it reaches the outbox", async () => {
    await expect(enqueueEmail(t.db, { to: "not an address", subject: "x", text: "x", kind: "digest" })).rejects.toThrow();
    await expect(enqueueEmail(t.db, { to: "a@example.org", subject: "two\nlines", text: "x", kind: "digest" })).rejects.toThrow();
  });
});

describe("retry delays", () => {
  it("start at 5 s, double each time and stop at 10 minutes (common practice)", () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8, 20].map(retryDelayMs)).toEqual([
      5_000, 10_000, 20_000, 40_000, 80_000, 160_000, 320_000, 600_000, 600_000,
    ]);
  });
});
