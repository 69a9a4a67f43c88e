// Password strength, checked before hashing. Follows NIST SP 800-63B section 5.1.1.2
// (memorized secrets): at least 8 characters (we ask 10), at most 64+ allowed, no composition
// rules, but reject values known to be commonly used or that contain the account's own name.

export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 256;

// A short list of the most common passwords and obvious choices for this product
// (common practice: a deny-list of frequently used values, as SP 800-63B asks).
const COMMON = new Set([
  "password", "password1", "password12", "password123", "passw0rd", "qwerty", "qwertyuiop", "123456",
  "1234567", "12345678", "123456789", "1234567890", "iloveyou", "letmein", "welcome", "welcome1",
  "admin", "abc123", "football", "monkey", "dragon", "sunshine", "princess", "trustno1", "111111",
  "000000", "sailboat", "sailing", "sistership", "sistership1", "boatowner", "myboat",
]);

export function passwordProblem(password: string, context: { email?: string; name?: string } = {}): string | null {
  if (password.length < MIN_PASSWORD_LENGTH) {
    return `Use at least ${MIN_PASSWORD_LENGTH} characters; a few ordinary words strung together work well.`;
  }
  if (password.length > MAX_PASSWORD_LENGTH) return `Use at most ${MAX_PASSWORD_LENGTH} characters.`;
  const lower = password.toLowerCase();
  if (COMMON.has(lower) || COMMON.has(lower.replace(/[0-9!.]+$/, ""))) {
    return "That password is one of the most common ones; choose something less guessable.";
  }
  if (/^(.)\1+$/.test(password)) return "A single repeated character is too easy to guess.";
  const local = context.email?.split("@")[0]?.toLowerCase();
  if (local && local.length >= 4 && lower.includes(local)) return "Do not use your e-mail address in your password.";
  return null;
}
