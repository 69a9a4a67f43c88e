// What a comment under a write-up may be: its length limits and the messages shown beside the field.
// No zod here: the write-up page's own script checks a comment with commentProblem() before it is
// sent, and the server checks it again with commentSchema (app/domain/conversation-forms.ts), which
// is built from the same limits and messages.

export const COMMENT_MIN = 2;
export const COMMENT_MAX = 4000;

export const COMMENT_MESSAGES = {
  missing: "Write your comment first.",
  tooShort: `Write at least ${COMMENT_MIN} characters.`,
  tooLong: `Keep it to ${COMMENT_MAX} characters; split a longer account into a write-up of its own.`,
} as const;

/** Line breaks as one character each (a browser sends CRLF; its maxlength counts one). */
export function normaliseLineBreaks(text: string): string {
  return text.replace(/\r\n?/g, "\n");
}

/** The comment as it is stored: one-character line breaks, no space around it. */
export function commentText(text: string): string {
  return normaliseLineBreaks(text).trim();
}

/** Why a comment cannot be posted as typed, or null when it can. */
export function commentProblem(text: string): string | null {
  const body = commentText(text);
  if (body.length < COMMENT_MIN) return COMMENT_MESSAGES.tooShort;
  if (body.length > COMMENT_MAX) return COMMENT_MESSAGES.tooLong;
  return null;
}
