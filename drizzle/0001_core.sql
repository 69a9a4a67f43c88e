CREATE TYPE "public"."difficulty" AS ENUM('easy', 'moderate', 'hard');--> statement-breakpoint
CREATE TYPE "public"."measure_method" AS ENUM('tape', 'story_stick', 'template', 'laser');--> statement-breakpoint
CREATE TYPE "public"."opening_face" AS ENUM('top', 'front', 'side', 'end');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('member', 'moderator', 'secretary', 'admin');--> statement-breakpoint
CREATE TYPE "public"."units" AS ENUM('in', 'mm');--> statement-breakpoint
CREATE TYPE "public"."writeup_status" AS ENUM('draft', 'awaiting_review', 'needs_changes', 'published', 'declined', 'withdrawn');--> statement-breakpoint
CREATE TABLE "boat_owners" (
	"boat_id" integer NOT NULL,
	"user_id" integer NOT NULL,
	CONSTRAINT "boat_owners_boat_id_user_id_pk" PRIMARY KEY("boat_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "boats" (
	"id" serial PRIMARY KEY NOT NULL,
	"hull_number" integer NOT NULL,
	"name" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "boats_hull_number_unique" UNIQUE("hull_number"),
	CONSTRAINT "boats_hull_number_range" CHECK ("boats"."hull_number" between 1 and 612)
);
--> statement-breakpoint
CREATE TABLE "space_measurements" (
	"id" serial PRIMARY KEY NOT NULL,
	"space_id" integer NOT NULL,
	"user_id" integer NOT NULL,
	"hull_number" integer NOT NULL,
	"method" "measure_method" NOT NULL,
	"measured_on" date NOT NULL,
	"length_mm" double precision NOT NULL,
	"width_mm" double precision NOT NULL,
	"height_mm" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "space_sections" (
	"id" serial PRIMARY KEY NOT NULL,
	"space_id" integer NOT NULL,
	"position" integer NOT NULL,
	"label" text NOT NULL,
	"length_mm" double precision NOT NULL,
	"width_mm" double precision NOT NULL,
	"height_mm" double precision NOT NULL
);
--> statement-breakpoint
CREATE TABLE "spaces" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"name" text NOT NULL,
	"zone_slug" text NOT NULL,
	"hull_from" integer DEFAULT 1 NOT NULL,
	"hull_to" integer DEFAULT 612 NOT NULL,
	"aft_of_bow_mm" double precision NOT NULL,
	"off_centre_mm" double precision DEFAULT 0 NOT NULL,
	"height_mm" double precision,
	"opening_width_mm" double precision,
	"opening_height_mm" double precision,
	"opening_face" "opening_face",
	"obstructions" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "spaces_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "systems" (
	"slug" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"sort_order" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "user_roles" (
	"user_id" integer NOT NULL,
	"role" "role" NOT NULL,
	CONSTRAINT "user_roles_user_id_role_pk" PRIMARY KEY("user_id","role")
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" serial PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"display_name" text NOT NULL,
	"credit_as" text,
	"units" "units" DEFAULT 'in' NOT NULL,
	"password_hash" text,
	"email_verified_at" timestamp with time zone,
	"digest_opt_in" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email"),
	CONSTRAINT "users_email_lower_case" CHECK ("users"."email" = lower("users"."email"))
);
--> statement-breakpoint
CREATE TABLE "writeup_parts" (
	"id" serial PRIMARY KEY NOT NULL,
	"writeup_id" integer NOT NULL,
	"position" integer NOT NULL,
	"name" text NOT NULL,
	"quantity" double precision DEFAULT 1 NOT NULL,
	"weight_kg" double precision,
	"note" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "writeup_spaces" (
	"writeup_id" integer NOT NULL,
	"space_id" integer NOT NULL,
	CONSTRAINT "writeup_spaces_writeup_id_space_id_pk" PRIMARY KEY("writeup_id","space_id")
);
--> statement-breakpoint
CREATE TABLE "writeup_systems" (
	"writeup_id" integer NOT NULL,
	"system_slug" text NOT NULL,
	CONSTRAINT "writeup_systems_writeup_id_system_slug_pk" PRIMARY KEY("writeup_id","system_slug")
);
--> statement-breakpoint
CREATE TABLE "writeup_zones" (
	"writeup_id" integer NOT NULL,
	"zone_slug" text NOT NULL,
	CONSTRAINT "writeup_zones_writeup_id_zone_slug_pk" PRIMARY KEY("writeup_id","zone_slug")
);
--> statement-breakpoint
CREATE TABLE "writeups" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"body_markdown" text DEFAULT '' NOT NULL,
	"body_text" text DEFAULT '' NOT NULL,
	"status" "writeup_status" DEFAULT 'draft' NOT NULL,
	"author_id" integer NOT NULL,
	"boat_id" integer,
	"hull_from" integer DEFAULT 1 NOT NULL,
	"hull_to" integer DEFAULT 612 NOT NULL,
	"difficulty" "difficulty",
	"hours_spent" double precision,
	"cost_usd" double precision,
	"published_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"search" "tsvector" GENERATED ALWAYS AS (
    setweight(to_tsvector('english', coalesce(title, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(summary, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(body_text, '')), 'C')) STORED,
	CONSTRAINT "writeups_slug_unique" UNIQUE("slug"),
	CONSTRAINT "writeups_hull_range" CHECK ("writeups"."hull_from" between 1 and "writeups"."hull_to" and "writeups"."hull_to" <= 612)
);
--> statement-breakpoint
CREATE TABLE "zones" (
	"slug" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"sort_order" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
ALTER TABLE "boat_owners" ADD CONSTRAINT "boat_owners_boat_id_boats_id_fk" FOREIGN KEY ("boat_id") REFERENCES "public"."boats"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "boat_owners" ADD CONSTRAINT "boat_owners_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD CONSTRAINT "space_measurements_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD CONSTRAINT "space_measurements_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_sections" ADD CONSTRAINT "space_sections_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spaces" ADD CONSTRAINT "spaces_zone_slug_zones_slug_fk" FOREIGN KEY ("zone_slug") REFERENCES "public"."zones"("slug") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "user_roles" ADD CONSTRAINT "user_roles_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_parts" ADD CONSTRAINT "writeup_parts_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_spaces" ADD CONSTRAINT "writeup_spaces_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_spaces" ADD CONSTRAINT "writeup_spaces_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_systems" ADD CONSTRAINT "writeup_systems_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_systems" ADD CONSTRAINT "writeup_systems_system_slug_systems_slug_fk" FOREIGN KEY ("system_slug") REFERENCES "public"."systems"("slug") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_zones" ADD CONSTRAINT "writeup_zones_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_zones" ADD CONSTRAINT "writeup_zones_zone_slug_zones_slug_fk" FOREIGN KEY ("zone_slug") REFERENCES "public"."zones"("slug") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeups" ADD CONSTRAINT "writeups_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeups" ADD CONSTRAINT "writeups_boat_id_boats_id_fk" FOREIGN KEY ("boat_id") REFERENCES "public"."boats"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "writeups_search_idx" ON "writeups" USING gin ("search");--> statement-breakpoint
CREATE INDEX "writeups_status_published_idx" ON "writeups" USING btree ("status","published_at");