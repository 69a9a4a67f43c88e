import { describe, expect, it } from "vitest";
import { missingOvercurrentProtection } from "~/domain/writeup-checks";
import { slugify, writeupFormSchema } from "~/domain/writeup-form";
import { canEdit, REVISION_STATES, transition } from "~/domain/writeup-lifecycle";

const author = { isAuthor: true, isModerator: false };
const moderator = { isAuthor: false, isModerator: true };
const authorModerator = { isAuthor: true, isModerator: true };

describe("who may move a revision from which state to which", () => {
  it("only the author submits, from Draft or Needs changes", () => {
    for (const state of REVISION_STATES) {
      const t = transition(state, "submit", author);
      expect({ state, ok: t.ok }).toEqual({ state, ok: state === "draft" || state === "needs_changes" });
    }
    expect(transition("draft", "submit", moderator).ok).toBe(false);
  });
  it("only another moderator decides, and only on a revision awaiting review", () => {
    for (const d of ["publish", "request_changes", "decline"] as const) {
      for (const state of REVISION_STATES) expect(transition(state, d, moderator).ok).toBe(state === "awaiting_review");
      expect(transition("awaiting_review", d, author).ok).toBe(false);
      expect(transition("awaiting_review", d, authorModerator).ok).toBe(false);
    }
  });
  it("the text can be edited in Draft and Needs changes only", () => {
    expect(REVISION_STATES.filter(canEdit)).toEqual(["draft", "needs_changes"]);
  });
});

describe("the fuse-or-breaker check", () => {
  // 33 CFR 183.455 requires overcurrent protection for such circuits; ABYC E-11 likewise.
  it("warns an electrical write-up about a battery without a fuse or breaker", () => {
    expect(missingOvercurrentProtection(["electrical"], "Moved the battery aft and ran new cable.")).toBe(true);
    expect(missingOvercurrentProtection(["electrical"], "Moved the battery; a 100 A fuse within 7 in of the terminal.")).toBe(false);
    expect(missingOvercurrentProtection(["electrical"], "New cable to a 15 A breaker on the panel.")).toBe(false);
    expect(missingOvercurrentProtection(["joinery"], "A box for the battery.")).toBe(false);
  });
});

describe("the editor's form", () => {
  const schema = writeupFormSchema({ systems: ["electrical"], zones: ["bilge"], weightUnit: "lb" });
  it("names the field at fault", () => {
    const r = schema.safeParse({ title: "Hi", summary: "short", body: "", systems: [], appliesTo: "700-800", parts: [{ name: "", quantity: "0", weight: "heavy" }] });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["title", "summary", "systems", "appliesTo", "parts.0.name", "parts.0.quantity", "parts.0.weight"]));
  });
  it("saves a draft with only its title, and asks for the rest when it is sent for review", () => {
    const draft = writeupFormSchema({ systems: ["electrical"], zones: ["bilge"], weightUnit: "lb", draft: true });
    const onlyTitle = { title: "Second battery in the port cockpit locker", appliesTo: "all" };
    const saved = draft.safeParse(onlyTitle);
    expect(saved.success).toBe(true);
    expect(saved.data).toMatchObject({ summary: "", body: "", systems: [] });
    // A draft still needs a title, and nothing too long or outside the lists.
    expect(draft.safeParse({ ...onlyTitle, title: "" }).success).toBe(false);
    expect(draft.safeParse({ ...onlyTitle, systems: ["plumbing"] }).success).toBe(false);
    const sent = schema.safeParse(onlyTitle);
    expect(sent.success).toBe(false);
    expect(sent.error!.issues.map((i) => i.path.join("."))).toEqual(expect.arrayContaining(["summary", "systems"]));
  });
  it("makes addresses from titles", () => {
    expect(slugify("Group 27 battery, moved under the settee!")).toBe("group-27-battery-moved-under-the-settee");
    expect(slugify("Crème brûlée locker")).toBe("creme-brulee-locker");
    expect(slugify("!!!")).toBe("write-up");
  });
});
