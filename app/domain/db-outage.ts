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
  /** What the form held, except passwords and tokens. */
  fields: { name: string; value: string }[];
  /** True when a password or token field was left out of `fields`. */
  secretsLeftOut: boolean;
  retryAfterSeconds: number;
};

export function isDatabaseOutage(value: unknown): value is DatabaseOutage {
  return !!value && typeof value === "object" && (value as { kind?: unknown }).kind === DATABASE_OUTAGE.kind;
}
