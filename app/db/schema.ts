// The database schema. Lengths are stored in millimetres, weights in kilograms
// (app/domain/units.ts converts what people type and what they read).
import { sql } from "drizzle-orm";
import {
  boolean, check, customType, date, doublePrecision, index, integer, pgEnum, pgTable, primaryKey, serial,
  text, timestamp,
} from "drizzle-orm/pg-core";

const tsvector = customType<{ data: string }>({ dataType: () => "tsvector" });

export const roleEnum = pgEnum("role", ["member", "moderator", "secretary", "admin"]);
export const unitsEnum = pgEnum("units", ["in", "mm"]);
export const writeupStatusEnum = pgEnum("writeup_status", [
  "draft", "awaiting_review", "needs_changes", "published", "declined", "withdrawn",
]);
export const difficultyEnum = pgEnum("difficulty", ["easy", "moderate", "hard"]);
export const measureMethodEnum = pgEnum("measure_method", ["tape", "story_stick", "template", "laser"]);
export const openingFaceEnum = pgEnum("opening_face", ["top", "front", "side", "end"]);

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

export const users = pgTable("users", {
  id: serial("id").primaryKey(),
  email: text("email").notNull().unique(), // stored lower-case
  displayName: text("display_name").notNull(),
  creditAs: text("credit_as"),
  units: unitsEnum("units").notNull().default("in"),
  passwordHash: text("password_hash"),
  emailVerifiedAt: timestamp("email_verified_at", { withTimezone: true }),
  digestOptIn: boolean("digest_opt_in").notNull().default(true),
  createdAt: createdAt(),
}, (t) => [check("users_email_lower_case", sql`${t.email} = lower(${t.email})`)]);

export const userRoles = pgTable("user_roles", {
  userId: integer("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
  role: roleEnum("role").notNull(),
}, (t) => [primaryKey({ columns: [t.userId, t.role] })]);

export const boats = pgTable("boats", {
  id: serial("id").primaryKey(),
  hullNumber: integer("hull_number").notNull().unique(),
  name: text("name"),
  createdAt: createdAt(),
}, (t) => [check("boats_hull_number_range", sql`${t.hullNumber} between 1 and 612`)]);

export const boatOwners = pgTable("boat_owners", {
  boatId: integer("boat_id").notNull().references(() => boats.id, { onDelete: "cascade" }),
  userId: integer("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
}, (t) => [primaryKey({ columns: [t.boatId, t.userId] })]);

export const systems = pgTable("systems", {
  slug: text("slug").primaryKey(),
  name: text("name").notNull(),
  description: text("description").notNull().default(""),
  sortOrder: integer("sort_order").notNull().default(0),
});

export const zones = pgTable("zones", {
  slug: text("slug").primaryKey(),
  name: text("name").notNull(),
  sortOrder: integer("sort_order").notNull().default(0),
});

export const writeups = pgTable("writeups", {
  id: serial("id").primaryKey(),
  slug: text("slug").notNull().unique(),
  title: text("title").notNull(),
  summary: text("summary").notNull().default(""),
  bodyMarkdown: text("body_markdown").notNull().default(""),
  bodyText: text("body_text").notNull().default(""),
  status: writeupStatusEnum("status").notNull().default("draft"),
  authorId: integer("author_id").notNull().references(() => users.id),
  boatId: integer("boat_id").references(() => boats.id),
  hullFrom: integer("hull_from").notNull().default(1),
  hullTo: integer("hull_to").notNull().default(612),
  difficulty: difficultyEnum("difficulty"),
  hoursSpent: doublePrecision("hours_spent"),
  costUsd: doublePrecision("cost_usd"),
  publishedAt: timestamp("published_at", { withTimezone: true }),
  createdAt: createdAt(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  search: tsvector("search").generatedAlwaysAs(sql`
    setweight(to_tsvector('english', coalesce(title, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(summary, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(body_text, '')), 'C')`),
}, (t) => [
  index("writeups_search_idx").using("gin", t.search),
  index("writeups_status_published_idx").on(t.status, t.publishedAt),
  check("writeups_hull_range", sql`${t.hullFrom} between 1 and ${t.hullTo} and ${t.hullTo} <= 612`),
]);

export const writeupSystems = pgTable("writeup_systems", {
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  systemSlug: text("system_slug").notNull().references(() => systems.slug),
}, (t) => [primaryKey({ columns: [t.writeupId, t.systemSlug] })]);

export const writeupZones = pgTable("writeup_zones", {
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  zoneSlug: text("zone_slug").notNull().references(() => zones.slug),
}, (t) => [primaryKey({ columns: [t.writeupId, t.zoneSlug] })]);

export const writeupParts = pgTable("writeup_parts", {
  id: serial("id").primaryKey(),
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  position: integer("position").notNull(),
  name: text("name").notNull(),
  quantity: doublePrecision("quantity").notNull().default(1),
  weightKg: doublePrecision("weight_kg"),
  note: text("note").notNull().default(""),
});

export const spaces = pgTable("spaces", {
  id: serial("id").primaryKey(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  zoneSlug: text("zone_slug").notNull().references(() => zones.slug),
  hullFrom: integer("hull_from").notNull().default(1),
  hullTo: integer("hull_to").notNull().default(612),
  // Position in the boat: distance aft of the bow, offset from the centreline
  // (+ starboard, - port), height above the canoe body's lowest inside point.
  aftOfBowMm: doublePrecision("aft_of_bow_mm").notNull(),
  offCentreMm: doublePrecision("off_centre_mm").notNull().default(0),
  heightMm: doublePrecision("height_mm"),
  openingWidthMm: doublePrecision("opening_width_mm"),
  openingHeightMm: doublePrecision("opening_height_mm"),
  openingFace: openingFaceEnum("opening_face"),
  obstructions: text("obstructions").notNull().default(""),
  createdAt: createdAt(),
});

export const spaceSections = pgTable("space_sections", {
  id: serial("id").primaryKey(),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
  position: integer("position").notNull(),
  label: text("label").notNull(),
  lengthMm: doublePrecision("length_mm").notNull(),
  widthMm: doublePrecision("width_mm").notNull(),
  heightMm: doublePrecision("height_mm").notNull(),
});

export const spaceMeasurements = pgTable("space_measurements", {
  id: serial("id").primaryKey(),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
  userId: integer("user_id").notNull().references(() => users.id),
  hullNumber: integer("hull_number").notNull(),
  method: measureMethodEnum("method").notNull(),
  measuredOn: date("measured_on").notNull(),
  lengthMm: doublePrecision("length_mm").notNull(),
  widthMm: doublePrecision("width_mm").notNull(),
  heightMm: doublePrecision("height_mm").notNull(),
  createdAt: createdAt(),
});

export const writeupSpaces = pgTable("writeup_spaces", {
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
}, (t) => [primaryKey({ columns: [t.writeupId, t.spaceId] })]);

// --- Accounts: sessions, one-time links, rate limits ---

export const tokenKindEnum = pgEnum("token_kind", ["verify_email", "reset_password"]);

/** A signed-in browser. The cookie carries only this row's id; revoking deletes the row. */
export const sessions = pgTable("sessions", {
  id: text("id").primaryKey(),
  userId: integer("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
  createdAt: createdAt(),
  lastSeenAt: timestamp("last_seen_at", { withTimezone: true }).notNull().defaultNow(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  userAgent: text("user_agent").notNull().default(""),
}, (t) => [index("sessions_user_idx").on(t.userId)]);

/** E-mail verification and password-reset links: only a hash of the token is stored. */
export const authTokens = pgTable("auth_tokens", {
  id: serial("id").primaryKey(),
  userId: integer("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
  kind: tokenKindEnum("kind").notNull(),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  usedAt: timestamp("used_at", { withTimezone: true }),
  createdAt: createdAt(),
});

/** Fixed-window counters for rate limits (sign-in, sign-up, reset), keyed by purpose and subject. */
export const rateLimits = pgTable("rate_limits", {
  key: text("key").notNull(),
  windowStart: timestamp("window_start", { withTimezone: true }).notNull(),
  count: integer("count").notNull().default(0),
}, (t) => [primaryKey({ columns: [t.key, t.windowStart] })]);

// --- E-mail outbox: every message is written here first, then sent (with retries) ---

export const outbox = pgTable("outbox", {
  id: serial("id").primaryKey(),
  toAddress: text("to_address").notNull(),
  subject: text("subject").notNull(),
  textBody: text("text_body").notNull(),
  htmlBody: text("html_body"),
  kind: text("kind").notNull(),
  createdAt: createdAt(),
  attempts: integer("attempts").notNull().default(0),
  nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
  sentAt: timestamp("sent_at", { withTimezone: true }),
  lastError: text("last_error"),
}, (t) => [index("outbox_pending_idx").on(t.nextAttemptAt).where(sql`sent_at is null`)]);
