// What every browser journey sets up: a server and database of its own (a fresh copy of the
// seeded template), Chromium with one page, and a list of what went wrong in the browser (page
// errors, console errors, 5xx answers) that the journey's last step expects to be empty.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach } from "vitest";
import { type AppServer, startAppServer } from "./app-server";
import { keepEvidenceOnFailure, launchBrowser } from "./browser";

export type Journey = { server: AppServer; page: Page; errors: string[] };

export function journeyOnItsOwnServer(name: string, viewport = { width: 1280, height: 1000 }): Journey {
  const journey = { errors: [] as string[] } as Journey;
  let browser: Browser | undefined;
  beforeAll(async () => {
    [journey.server, browser] = await Promise.all([startAppServer(), launchBrowser()]);
    const context = await browser.newContext({ viewport });
    const page = await context.newPage();
    const { errors } = journey;
    page.on("pageerror", (e) => errors.push(e.message));
    page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
    page.on("response", (r) => { if (r.status() >= 500) errors.push(`${r.status()} ${r.url()}`); });
    journey.page = page;
  });
  beforeEach(keepEvidenceOnFailure(name, () => journey.page));
  afterAll(async () => {
    await browser?.close();
    await journey.server?.stop();
  });
  return journey;
}
