// The database schema. Lengths are stored in millimetres, weights in kilograms
// (app/domain/units.ts converts what people type and what they read).
import { sql } from "drizzle-orm";
import type { DigestSnapshot } from "../domain/digest";
import {
  boolean, check, customType, date, doublePrecision, foreignKey, index, integer, jsonb, pgEnum, pgTable, primaryKey, serial,
  text, timestamp, uniqueIndex,
} from "drizzle-orm/pg-core";

const tsvector = customType<{ data: string }>({ dataType: () => "tsvector" });
// The cube extension's type (drizzle/0000_extensions.sql); read as its text form "(a, b, c)".
const cube = customType<{ data: string }>({ dataType: () => "cube" });

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
  // The names of the write-up's systems and zones, kept by triggers (drizzle/*_search_vocabulary.sql).
  searchTags: text("search_tags").notNull().default(""),
  // The same as filter words ("system:electrical", "zone:lazarette"), kept by the same triggers
  // (drizzle/*_search_filters.sql): a filter is a second column of the words' GIN index.
  searchFilters: text("search_filters").array().notNull().default(sql`'{}'::text[]`),
  search: tsvector("search").generatedAlwaysAs(sql`
    setweight(to_tsvector('english', coalesce(title, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(search_tags, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(summary, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(body_text, '')), 'C')`),
}, (t) => [
  // The words and the filter words in one GIN index: a search narrowed by a system or a zone
  // reads only the write-ups that have both, instead of checking every match of the words in the
  // table (a multicolumn GIN index: PostgreSQL 15 documentation, 11.3 "Multicolumn Indexes").
  index("writeups_search_idx").using("gin", t.search, t.searchFilters).where(sql`status = 'published'`),
  // The titles alone, so that a search that matches many write-ups ranks those with its words in
  // the title among the ones it reads (app/models/search.server.ts).
  index("writeups_title_search_idx").using("gin", sql`to_tsvector('english', ${t.title})`).where(sql`status = 'published'`),
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
  // Search (see the end of this file): name A, zone B, what is in the way C.
  search: tsvector("search").generatedAlwaysAs(sql`
    setweight(to_tsvector('english', coalesce(name, '')), 'A') ||
    setweight(to_tsvector('english', replace(zone_slug, '-', ' ')), 'B') ||
    setweight(to_tsvector('english', coalesce(obstructions, '')), 'C')`),
}, (t) => [index("spaces_search_idx").using("gin", t.search), index("spaces_zone_idx").on(t.zoneSlug)]);

// The size of a section as the fit uses it (SQL): the consensus where there is one.
const FIT_L = "coalesce(consensus_length_mm, length_mm)";
const FIT_W = "coalesce(consensus_width_mm, width_mm)";
const FIT_H = "coalesce(consensus_height_mm, height_mm)";

export const spaceSections = pgTable("space_sections", {
  id: serial("id").primaryKey(),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
  position: integer("position").notNull(),
  label: text("label").notNull(),
  lengthMm: doublePrecision("length_mm").notNull(),
  widthMm: doublePrecision("width_mm").notNull(),
  heightMm: doublePrecision("height_mm").notNull(),
  // Fit search (see "Items and fit search" at the end): the consensus of the members'
  // measurements of the main section, kept by app/models/spaces.server.ts, and the box the fit
  // uses (the consensus where there is one, else the size above) as points for the GiST index:
  // its sorted dimensions, then its volume (the fit search reads them smallest first).
  consensusLengthMm: doublePrecision("consensus_length_mm"),
  consensusWidthMm: doublePrecision("consensus_width_mm"),
  consensusHeightMm: doublePrecision("consensus_height_mm"),
  // Any way up: the three dimensions, largest first.
  fitAny: cube("fit_any").notNull().generatedAlwaysAs(sql.raw(`cube(array[
    greatest(${FIT_L}, ${FIT_W}, ${FIT_H}),
    greatest(least(${FIT_L}, ${FIT_W}), least(greatest(${FIT_L}, ${FIT_W}), ${FIT_H})),
    least(${FIT_L}, ${FIT_W}, ${FIT_H}),
    ${FIT_L} * ${FIT_W} * ${FIT_H}]::float8[])`)),
  // Upright: the footprint, larger side first, then the height.
  fitUpright: cube("fit_upright").notNull().generatedAlwaysAs(sql.raw(`cube(array[
    greatest(${FIT_L}, ${FIT_W}),
    least(${FIT_L}, ${FIT_W}),
    ${FIT_H},
    ${FIT_L} * ${FIT_W} * ${FIT_H}]::float8[])`)),
}, (t) => [
  // Unique: measurements name their section by (space, position).
  uniqueIndex("space_sections_space_idx").on(t.spaceId, t.position),
  index("space_sections_fit_any_idx").using("gist", t.fitAny),
  index("space_sections_fit_upright_idx").using("gist", t.fitUpright),
]);

export const spaceMeasurements = pgTable("space_measurements", {
  id: serial("id").primaryKey(),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
  // Which section was measured (its position; 0 is the main one).
  section: integer("section").notNull().default(0),
  userId: integer("user_id").notNull().references(() => users.id),
  hullNumber: integer("hull_number").notNull(),
  method: measureMethodEnum("method").notNull(),
  measuredOn: date("measured_on").notNull(),
  lengthMm: doublePrecision("length_mm").notNull(),
  widthMm: doublePrecision("width_mm").notNull(),
  heightMm: doublePrecision("height_mm").notNull(),
  photoId: integer("photo_id").references(() => photos.id, { onDelete: "set null" }),
  createdAt: createdAt(),
  // The last change after it was added, and by whom (its author or a moderator).
  updatedAt: timestamp("updated_at", { withTimezone: true }),
  updatedBy: integer("updated_by").references(() => users.id, { onDelete: "set null" }),
}, (t) => [
  index("space_measurements_space_idx").on(t.spaceId),
  foreignKey({
    name: "space_measurements_section_fk",
    columns: [t.spaceId, t.section],
    foreignColumns: [spaceSections.spaceId, spaceSections.position],
  }).onDelete("cascade").onUpdate("cascade"),
]);

export const measurementChangeEnum = pgEnum("measurement_change", ["edited", "deleted"]);

/** Who changed or removed a measurement, when, and what it said before (and after). */
export const measurementChanges = pgTable("measurement_changes", {
  id: serial("id").primaryKey(),
  spaceId: integer("space_id").notNull().references(() => spaces.id, { onDelete: "cascade" }),
  // No reference: the measurement may be gone.
  measurementId: integer("measurement_id").notNull(),
  kind: measurementChangeEnum("kind").notNull(),
  changedBy: integer("changed_by").references(() => users.id, { onDelete: "set null" }),
  // The member who took the measurement.
  takenBy: integer("taken_by").references(() => users.id, { onDelete: "set null" }),
  before: jsonb("before").$type<MeasurementRecord>().notNull(),
  after: jsonb("after").$type<MeasurementRecord>(),
  reason: text("reason").notNull().default(""),
  changedAt: timestamp("changed_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("measurement_changes_space_idx").on(t.spaceId, t.changedAt)]);

/** A measurement as kept in its history (millimetres). */
export type MeasurementRecord = {
  section: number;
  hullNumber: number;
  method: string;
  measuredOn: string;
  lengthMm: number;
  widthMm: number;
  heightMm: number;
  photoId: number | null;
};

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

// --- Photos: stored in the object store (S3 protocol); this row is what the app knows of each ---

export const photos = pgTable("photos", {
  id: serial("id").primaryKey(),
  // Object key of the full-size image; the thumbnail is stored under `${key}.thumb.webp`.
  storageKey: text("storage_key").notNull().unique(),
  uploadedBy: integer("uploaded_by").notNull().references(() => users.id),
  contentType: text("content_type").notNull(),
  widthPx: integer("width_px").notNull(),
  heightPx: integer("height_px").notNull(),
  bytes: integer("bytes").notNull(),
  caption: text("caption").notNull().default(""),
  createdAt: createdAt(),
});

// --- Items and fit search ---

export const itemKindEnum = pgEnum("item_kind", ["battery-group", "member-item"]);
export const itemOrientationEnum = pgEnum("item_orientation", ["any", "upright"]);

/** The catalogue of box-shaped things members want to fit: BCI battery groups and members' items. */
export const items = pgTable("items", {
  id: serial("id").primaryKey(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  kind: itemKindEnum("kind").notNull(),
  lengthMm: doublePrecision("length_mm").notNull(),
  widthMm: doublePrecision("width_mm").notNull(),
  heightMm: doublePrecision("height_mm").notNull(),
  weightKg: doublePrecision("weight_kg"),
  // "upright": must stay with its height vertical (a flooded battery, a tank with a vent).
  orientation: itemOrientationEnum("orientation").notNull().default("any"),
  note: text("note").notNull().default(""),
  addedBy: integer("added_by").references(() => users.id, { onDelete: "set null" }),
  createdAt: createdAt(),
  // Search (see the end of this file): name A, note C.
  search: tsvector("search").generatedAlwaysAs(sql`
    setweight(to_tsvector('english', coalesce(name, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(note, '')), 'C')`),
}, (t) => [
  check("items_positive_size", sql`${t.lengthMm} > 0 and ${t.widthMm} > 0 and ${t.heightMm} > 0`),
  index("items_search_idx").using("gin", t.search),
]);

// --- Write-ups: revisions, review decisions, comments, "done on my boat too" ---

export type PartRow = { name: string; quantity: number; weightKg: number | null; note: string };

/**
 * Every version of a write-up. The `writeups` row shows the published revision (or, before the
 * first publication, the latest one); a new revision of a published write-up waits here for review.
 */
export const writeupRevisions = pgTable("writeup_revisions", {
  id: serial("id").primaryKey(),
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  number: integer("number").notNull(),
  status: writeupStatusEnum("status").notNull().default("draft"),
  authorId: integer("author_id").notNull().references(() => users.id),
  title: text("title").notNull(),
  summary: text("summary").notNull().default(""),
  bodyMarkdown: text("body_markdown").notNull().default(""),
  systems: text("systems").array().notNull().default(sql`'{}'`),
  zones: text("zones").array().notNull().default(sql`'{}'`),
  hullFrom: integer("hull_from").notNull().default(1),
  hullTo: integer("hull_to").notNull().default(612),
  boatId: integer("boat_id").references(() => boats.id),
  difficulty: difficultyEnum("difficulty"),
  hoursSpent: doublePrecision("hours_spent"),
  costUsd: doublePrecision("cost_usd"),
  parts: jsonb("parts").$type<PartRow[]>().notNull().default(sql`'[]'::jsonb`),
  createdAt: createdAt(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  submittedAt: timestamp("submitted_at", { withTimezone: true }),
  decidedAt: timestamp("decided_at", { withTimezone: true }),
}, (t) => [
  uniqueIndex("writeup_revisions_number_idx").on(t.writeupId, t.number),
  index("writeup_revisions_status_idx").on(t.status, t.submittedAt),
]);

export const reviewDecisionEnum = pgEnum("review_decision", ["publish", "request_changes", "decline", "withdraw"]);

/** Who decided what about which revision, when and why. Never updated, never deleted. */
export const reviewDecisions = pgTable("review_decisions", {
  id: serial("id").primaryKey(),
  revisionId: integer("revision_id").notNull().references(() => writeupRevisions.id, { onDelete: "cascade" }),
  decidedBy: integer("decided_by").notNull().references(() => users.id),
  decision: reviewDecisionEnum("decision").notNull(),
  reason: text("reason").notNull().default(""),
  checklist: jsonb("checklist").$type<Record<string, boolean>>().notNull().default(sql`'{}'::jsonb`),
  createdAt: createdAt(),
});

export const comments = pgTable("comments", {
  id: serial("id").primaryKey(),
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  userId: integer("user_id").notNull().references(() => users.id),
  body: text("body").notNull(),
  createdAt: createdAt(),
}, (t) => [index("comments_writeup_idx").on(t.writeupId, t.createdAt)]);

/** "Done on my boat too": one row per write-up and hull. */
export const doneToo = pgTable("done_too", {
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  hullNumber: integer("hull_number").notNull(),
  userId: integer("user_id").notNull().references(() => users.id),
  createdAt: createdAt(),
}, (t) => [primaryKey({ columns: [t.writeupId, t.hullNumber] })]);

// --- Boats: weight ledger and class particulars ---
// Heel and trim of each registered boat (app/domain/stability.ts, app/domain/ledger.ts).
// Weights in kg and lengths in mm, like everything else; positions as for spaces: distance aft
// of the bow, offset from the centreline (+ starboard, - port), height above the inside of the
// hull bottom at the keel stub.

/** The class's particulars, set by an administrator: one row (id 1). */
export const classParticulars = pgTable("class_particulars", {
  id: integer("id").primaryKey().default(1),
  lightDisplacementKg: doublePrecision("light_displacement_kg").notNull(),
  gmMm: doublePrecision("gm_mm").notNull(),
  lwlMm: doublePrecision("lwl_mm").notNull(),
  beamMm: doublePrecision("beam_mm").notNull(),
  loaMm: doublePrecision("loa_mm").notNull(),
  lcfAftOfBowMm: doublePrecision("lcf_aft_of_bow_mm").notNull(),
  waterlineForwardEndMm: doublePrecision("waterline_forward_end_mm").notNull().default(0),
  // For trim, either the longitudinal metacentric height or the moment to change trim one inch
  // (in the trade's unit, ft·lb per inch); GM_L wins when both are given.
  gmLongitudinalMm: doublePrecision("gm_longitudinal_mm"),
  mct1FtLbPerIn: doublePrecision("mct1_ft_lb_per_in"),
  // True while the figures are the invented demo values, so every page can say so.
  demo: boolean("demo").notNull().default(false),
  updatedBy: integer("updated_by").references(() => users.id, { onDelete: "set null" }),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  check("class_particulars_one_row", sql`${t.id} = 1`),
  check("class_particulars_positive", sql`${t.lightDisplacementKg} > 0 and ${t.gmMm} > 0 and ${t.lwlMm} > 0 and ${t.beamMm} > 0 and ${t.loaMm} > 0`),
]);

/** Items every boat of the class may carry, offered to owners with demo weights and positions to adjust. */
export const ledgerStandardItems = pgTable("ledger_standard_items", {
  id: serial("id").primaryKey(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  weightKg: doublePrecision("weight_kg").notNull(),
  aftOfBowMm: doublePrecision("aft_of_bow_mm").notNull(),
  offCentreMm: doublePrecision("off_centre_mm").notNull().default(0),
  heightMm: doublePrecision("height_mm"),
  note: text("note").notNull().default(""),
  sortOrder: integer("sort_order").notNull().default(0),
});

/** A boat's weight ledger: what the owner added, where it sits. */
export const boatLedgerItems = pgTable("boat_ledger_items", {
  id: serial("id").primaryKey(),
  boatId: integer("boat_id").notNull().references(() => boats.id, { onDelete: "cascade" }),
  name: text("name").notNull(),
  weightKg: doublePrecision("weight_kg").notNull(),
  aftOfBowMm: doublePrecision("aft_of_bow_mm").notNull(),
  offCentreMm: doublePrecision("off_centre_mm").notNull().default(0),
  heightMm: doublePrecision("height_mm"),
  // The space of the register it sits in, when the owner picked one.
  spaceId: integer("space_id").references(() => spaces.id, { onDelete: "set null" }),
  standardItemSlug: text("standard_item_slug"),
  createdAt: createdAt(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  index("boat_ledger_items_boat_idx").on(t.boatId, t.id),
  check("boat_ledger_items_positive", sql`${t.weightKg} > 0 and ${t.aftOfBowMm} >= 0`),
]);

/** GM measured on one boat (the inclining relation); the latest overrides the class GM. */
export const boatGmCalibrations = pgTable("boat_gm_calibrations", {
  id: serial("id").primaryKey(),
  boatId: integer("boat_id").notNull().references(() => boats.id, { onDelete: "cascade" }),
  userId: integer("user_id").references(() => users.id, { onDelete: "set null" }),
  weightKg: doublePrecision("weight_kg").notNull(),
  shiftMm: doublePrecision("shift_mm").notNull(),
  displacementKg: doublePrecision("displacement_kg").notNull(),
  // The list measured: an angle, or a plumb line's deflection over its length.
  heelDeg: doublePrecision("heel_deg"),
  deflectionMm: doublePrecision("deflection_mm"),
  plumbLengthMm: doublePrecision("plumb_length_mm"),
  gmMm: doublePrecision("gm_mm").notNull(),
  createdAt: createdAt(),
}, (t) => [
  index("boat_gm_calibrations_boat_idx").on(t.boatId, t.createdAt),
  check("boat_gm_calibrations_observation", sql`${t.heelDeg} is not null or (${t.deflectionMm} is not null and ${t.plumbLengthMm} is not null)`),
]);

export const calculationKindEnum = pgEnum("calculation_kind", ["weight-move", "cable-run"]);

/**
 * A calculator attached to a write-up: its input (app/domain/calculations.ts); the numbers are computed when shown.
 * It belongs to the revision that attached it and stays in the later ones until a revision removes it: a
 * revision's numbers are those attached in it or before and not removed by then (docs/decisions/0011).
 */
export const writeupCalculations = pgTable("writeup_calculations", {
  id: serial("id").primaryKey(),
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  revisionId: integer("revision_id").notNull().references(() => writeupRevisions.id, { onDelete: "cascade" }),
  removedInRevisionId: integer("removed_in_revision_id").references(() => writeupRevisions.id, { onDelete: "set null" }),
  kind: calculationKindEnum("kind").notNull(),
  position: integer("position").notNull().default(0),
  title: text("title").notNull().default(""),
  input: jsonb("input").notNull(),
  createdBy: integer("created_by").references(() => users.id, { onDelete: "set null" }),
  createdAt: createdAt(),
}, (t) => [
  index("writeup_calculations_writeup_idx").on(t.writeupId, t.position),
  index("writeup_calculations_revision_idx").on(t.revisionId),
  // Numbers taken off in the revision that attached them are deleted, not marked.
  check("writeup_calculations_removed_later", sql`${t.removedInRevisionId} is null or ${t.removedInRevisionId} <> ${t.revisionId}`),
]);

// --- Search ---
// One search over published write-ups, spaces and catalogue items (app/models/search.server.ts):
// the `search` columns above (weighted tsvectors, GIN indexes), and the class's vocabulary.
// The rules that expand a query with these synonyms, the triggers that keep `writeups.search_tags`
// and the vocabulary for "did you mean" are SQL of our own: drizzle/*_search_vocabulary.sql
// (docs/decisions: query expansion from a table of synonyms).

/**
 * The trade's words that mean the same thing to an owner: every term of a group finds what any
 * other term of the group finds ("settee", "berth", "bunk"). A term may be a phrase ("stern locker").
 */
export const searchSynonyms = pgTable("search_synonyms", {
  id: serial("id").primaryKey(),
  groupName: text("group_name").notNull(),
  term: text("term").notNull().unique(),
}, (t) => [index("search_synonyms_group_idx").on(t.groupName)]);

/** Words of the published text with the number of documents that use them, for "did you mean". */
export const searchVocabulary = pgTable("search_vocabulary", {
  word: text("word").primaryKey(),
  documents: integer("documents").notNull(),
}, (t) => [index("search_vocabulary_trgm_idx").using("gin", t.word.op("gin_trgm_ops"))]);

// --- The yearly digest (app/domain/digest.ts, app/models/digests.server.ts) ---
// A secretary compiles a draft edition for a year from the write-ups published that year, orders
// and leaves out entries, then issues it: the issued edition's content is frozen in `content` and
// never changes; a correction is a new edition of the same year with a note.

export const digestStatusEnum = pgEnum("digest_status", ["draft", "issued"]);

export const digestEditions = pgTable("digest_editions", {
  id: serial("id").primaryKey(),
  year: integer("year").notNull(),
  edition: integer("edition").notNull(),
  status: digestStatusEnum("status").notNull().default("draft"),
  editorLetter: text("editor_letter").notNull().default(""),
  correctionNote: text("correction_note").notNull().default(""),
  compiledBy: integer("compiled_by").references(() => users.id, { onDelete: "set null" }),
  createdAt: createdAt(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  issuedAt: timestamp("issued_at", { withTimezone: true }),
  issuedBy: integer("issued_by").references(() => users.id, { onDelete: "set null" }),
  // The frozen edition (set once, when issued).
  content: jsonb("content").$type<DigestSnapshot>(),
  // The PDF, once built: its object key in the photo store's bucket.
  pdfKey: text("pdf_key"),
  pdfBuiltAt: timestamp("pdf_built_at", { withTimezone: true }),
  // How many members the e-mail was queued for (null: not sent).
  mailedCount: integer("mailed_count"),
}, (t) => [
  uniqueIndex("digest_editions_year_edition_idx").on(t.year, t.edition),
  uniqueIndex("digest_editions_one_draft_idx").on(t.year).where(sql`status = 'draft'`),
  check("digest_editions_year_range", sql`${t.year} between 1971 and 2200 and ${t.edition} >= 1`),
  check("digest_editions_issued_frozen", sql`${t.status} = 'draft' or (${t.content} is not null and ${t.issuedAt} is not null)`),
]);

/** A draft's entries: every write-up published in the year, in order, left out or not. */
export const digestEntries = pgTable("digest_entries", {
  editionId: integer("edition_id").notNull().references(() => digestEditions.id, { onDelete: "cascade" }),
  writeupId: integer("writeup_id").notNull().references(() => writeups.id, { onDelete: "cascade" }),
  // The system it is listed under (its first system by the taxonomy's order; "" if it has none).
  sectionSlug: text("section_slug").notNull().default(""),
  position: integer("position").notNull(),
  included: boolean("included").notNull().default(true),
}, (t) => [
  primaryKey({ columns: [t.editionId, t.writeupId] }),
  index("digest_entries_order_idx").on(t.editionId, t.position),
]);
