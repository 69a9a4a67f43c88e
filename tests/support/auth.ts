// Signing in through the real sign-in page in a browser test.
import type { Page } from "playwright-core";
import { DEMO_PASSWORD } from "../../scripts/seed-content";
import { BASE_URL } from "./browser";

export { DEMO_PASSWORD };

/** `baseUrl`: a server of the test file's own (tests/support/app-server.ts); the run's server by default. */
export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD, baseUrl = BASE_URL) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await Promise.all([page.waitForURL((url) => !url.pathname.startsWith("/sign-in")), page.getByRole("button", { name: "Sign in" }).click()]);
}

export async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out", exact: true }).click();
  await page.getByRole("link", { name: "Sign in", exact: true }).waitFor();
}
