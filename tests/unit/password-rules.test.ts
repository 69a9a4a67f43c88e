import { describe, expect, it } from "vitest";
import { MIN_PASSWORD_LENGTH, passwordProblem } from "~/domain/password-rules";

// NIST SP 800-63B, 5.1.1.2 (memorized secret verifiers): at least 8 characters, no composition
// rules, check against values known to be commonly used, and allow long passphrases (64+).
describe("password strength (NIST SP 800-63B 5.1.1.2)", () => {
  it("asks for at least the SP 800-63B minimum of 8 characters", () => {
    expect(MIN_PASSWORD_LENGTH).toBeGreaterThanOrEqual(8);
    expect(passwordProblem("a".repeat(MIN_PASSWORD_LENGTH - 2) + "b")).toMatch(/at least/);
  });

  it("refuses commonly used passwords, with a trailing digit or not", () => {
    expect(passwordProblem("password123")).toMatch(/most common/);
    expect(passwordProblem("1234567890")).toMatch(/most common/);
    expect(passwordProblem("qwertyuiop")).toMatch(/most common/);
  });

  it("imposes no composition rules: a lower-case passphrase is fine", () => {
    expect(passwordProblem("tiller and two shackles")).toBeNull();
  });

  it("accepts a 64-character passphrase", () => {
    expect(passwordProblem("x".repeat(20) + " wind against tide " + "y".repeat(25))).toBeNull();
  });

  it("refuses the account's own address and a repeated character", () => {
    expect(passwordProblem("nora.pelling-2025", { email: "nora.pelling@example.org" })).toMatch(/e-mail/);
    expect(passwordProblem("zzzzzzzzzzzz")).toMatch(/repeated/);
  });
});
