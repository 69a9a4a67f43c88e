// The write-up page checks a comment in the browser with commentProblem() (no zod in its script); the
// server checks it with commentSchema. Both must refuse and accept the same texts, with the same words.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { COMMENT_MAX, COMMENT_MIN, commentProblem, commentText } from "~/domain/comment-rules";
import { commentSchema } from "~/domain/conversation-forms";

/** The server's answer for a posted body: null when accepted, else the message beside the field. */
function serverProblem(body: string): string | null {
  const r = commentSchema.safeParse({ intent: "post", body });
  return r.success ? null : r.error.issues[0].message;
}

describe("a comment's length, as the browser and the server check it", () => {
  it("counts a line break once, as the browser's maxlength does", () => {
    // WHATWG HTML, "The textarea element": minlength/maxlength count the length of the element's API
    // value, whose line breaks are normalised to a single LF; on submission each becomes CRLF
    // ("converting a form data set": newlines normalised to CRLF). 4000 typed is 4001 sent.
    const typed = `${"y".repeat(1999)}\n${"y".repeat(2000)}`;
    const sent = typed.replace(/\n/g, "\r\n");
    expect(typed.length).toBe(COMMENT_MAX);
    expect(sent.length).toBe(COMMENT_MAX + 1);
    expect(commentProblem(typed)).toBeNull();
    expect(commentProblem(sent)).toBeNull();
    expect(serverProblem(sent)).toBeNull();
    expect(commentText(sent)).toBe(typed);
    // A lone CR (old Mac line end) is a line break too (the same normalisation in the HTML standard).
    expect(commentText("a\rb")).toBe("a\nb");
  });

  it("refuses too short and too long with the server's words", () => {
    expect(commentProblem("k")).toBe(`Write at least ${COMMENT_MIN} characters.`);
    expect(serverProblem("k")).toBe(`Write at least ${COMMENT_MIN} characters.`);
    // Spaces around the text do not count (the browser's minlength would let "  k  " through).
    expect(commentProblem("  k \n ")).toBe(serverProblem("  k \n "));
    expect(commentProblem("")).toBe(serverProblem(""));
    const long = "x".repeat(COMMENT_MAX + 1);
    expect(commentProblem(long)).toMatch(new RegExp(`${COMMENT_MAX} characters`));
    expect(commentProblem(long)).toBe(serverProblem(long));
  });

  it("agrees with the server on any text (property check)", () => {
    const lengths = [0, 1, 2, 3, COMMENT_MAX - 1, COMMENT_MAX, COMMENT_MAX + 1];
    const text = fc.oneof(
      fc.string({ unit: fc.constantFrom("a", " ", "\n", "\r", "\r\n", "\t", "é"), maxLength: 12 }),
      fc.tuple(fc.constantFrom(...lengths), fc.constantFrom("", " ", "\r\n", " \n ")).map(([n, pad]) => pad + "z".repeat(n) + pad),
    );
    fc.assert(fc.property(text, (t) => commentProblem(t) === serverProblem(t)), { numRuns: 500 });
  });
});
