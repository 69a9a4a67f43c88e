// Reads what the SMTP stand-in received (one JSON file per message, see scripts/smtp-standin-server.ts).
// `npm test` runs a stand-in for the whole run and sets MAIL_STANDIN_DIR to its folder.
import fs from "node:fs";
import path from "node:path";
import type { StoredMail } from "../../scripts/smtp-standin-server";

export type { StoredMail };

export function mailboxDir(): string {
  const dir = process.env.MAIL_STANDIN_DIR;
  if (!dir) throw new Error("MAIL_STANDIN_DIR is not set: run the tests through `npm test`.");
  return dir;
}

/** Every message in the folder, oldest first. */
export function readMailbox(dir: string = mailboxDir()): StoredMail[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith(".json") && !f.startsWith("."))
    .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), "utf8")) as StoredMail)
    .sort((a, b) => a.receivedAt.localeCompare(b.receivedAt) || a.id.localeCompare(b.id));
}

/** The first message (oldest first) that matches, waiting up to `timeoutMs` for it to arrive. */
export async function waitForMail(
  dir: string,
  predicate: (mail: StoredMail) => boolean,
  timeoutMs = 10_000,
): Promise<StoredMail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = readMailbox(dir).find(predicate);
    if (found) return found;
    if (Date.now() >= until) {
      const seen = readMailbox(dir).map((m) => `  ${m.to.join(", ")}: ${m.subject}`);
      throw new Error(`no matching message arrived in ${dir} within ${timeoutMs} ms; it holds:\n${seen.join("\n") || "  (nothing)"}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The http(s) links in a plain-text body, in order, without trailing punctuation. */
export function extractLinks(text: string): string[] {
  const links = text.match(/https?:\/\/[^\s<>"'()[\]]+/g) ?? [];
  return links.map((link) => link.replace(/[.,;:!?]+$/, ""));
}
