// Debian's Chromium driven by playwright-core (no browser download).
import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";

export const BASE_URL = process.env.E2E_BASE_URL ?? "http://127.0.0.1:3000";
export const ARTIFACTS_DIR = process.env.ARTIFACTS_DIR ?? path.resolve("test-artifacts");

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: [
      "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync",
    ],
  });
}

export function screenshotPath(name: string): string {
  fs.mkdirSync(ARTIFACTS_DIR, { recursive: true });
  return path.join(ARTIFACTS_DIR, `${name}.png`);
}

/** Saves a screenshot and the address of the page when a browser test fails, to see what the user would have seen. */
export function keepEvidenceOnFailure(name: string, getPage: () => Page | undefined) {
  return ({ onTestFailed, task }: { onTestFailed: (fn: () => Promise<void>) => void; task: { name: string } }) => {
    onTestFailed(async () => {
      const page = getPage();
      if (!page) return;
      const file = screenshotPath(`failed-${name}-${task.name.replace(/[^a-z0-9]+/gi, "-").slice(0, 60)}`);
      await page.screenshot({ path: file, fullPage: true }).catch(() => undefined);
      console.error(`[e2e] failed at ${page.url()}; screenshot ${file}`);
    });
  };
}
