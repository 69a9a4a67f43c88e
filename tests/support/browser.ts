// Debian's Chromium driven by playwright-core (no browser download).
import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser } from "playwright-core";

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
