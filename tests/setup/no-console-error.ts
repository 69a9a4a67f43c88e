import { afterEach } from "vitest";

// A test that makes the app log an error fails, even when its assertions pass.
const calls: unknown[][] = [];
const original = console.error;
console.error = (...args: unknown[]) => {
  calls.push(args);
  original(...args);
};
afterEach(() => {
  if (calls.length) {
    const messages = calls.splice(0).map((args) => args.map(String).join(" "));
    throw new Error(`console.error was called during the test:\n${messages.join("\n")}`);
  }
});

