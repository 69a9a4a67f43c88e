// What the app says while its database cannot be reached; shared by the server (which answers 503)
// and the error boundary (which shows it).

export const DATABASE_OUTAGE = {
  kind: "database-unavailable",
  title: "The database is not answering",
  pageMessage: "Sistership cannot reach its database just now, so nothing was changed. Try again in a minute.",
  postedMessage:
    "Sistership cannot reach its database just now, so nothing you typed was saved. It is all below: send it again in a minute, or copy it somewhere safe.",
  secretsLeftOut: "Passwords are not shown again here: type yours once more before you send the form.",
  apiMessage: "The database is not answering; nothing you sent was saved. Try again in a minute.",
} as const;

export type DatabaseOutage = {
  kind: typeof DATABASE_OUTAGE.kind;
  /** True when the failed request was a form being sent. */
  posted: boolean;
  /** Where the form was sent, to send it again. */
  action: string;
  /** The page to try again (for a call to /api/ made from a page: that page, when known). */
  page: string | null;
  /** What the form held, except passwords and tokens. */
  fields: { name: string; value: string }[];
  /** True when a password or token field was left out of `fields`. */
  secretsLeftOut: boolean;
  retryAfterSeconds: number;
};

/**
 * The outage described by an error response's data, or null. The data is the object itself (a
 * page or its data request) or, for an /api/ answer that reached a fetcher, its JSON text.
 */
export function databaseOutageFrom(value: unknown): DatabaseOutage | null {
  if (typeof value === "string") {
    try {
      value = JSON.parse(value);
    } catch {
      return null;
    }
  }
  if (!value || typeof value !== "object" || (value as { kind?: unknown }).kind !== DATABASE_OUTAGE.kind) return null;
  const v = value as Partial<DatabaseOutage>;
  return {
    kind: DATABASE_OUTAGE.kind,
    posted: v.posted === true,
    action: typeof v.action === "string" && v.action.startsWith("/") && !v.action.startsWith("//") ? v.action : "/",
    page: typeof v.page === "string" && v.page.startsWith("/") && !v.page.startsWith("//") ? v.page : null,
    fields: Array.isArray(v.fields) ? v.fields.filter((f) => f && typeof f.name === "string" && typeof f.value === "string") : [],
    secretsLeftOut: v.secretsLeftOut === true,
    retryAfterSeconds: typeof v.retryAfterSeconds === "number" ? v.retryAfterSeconds : 30,
  };
}
