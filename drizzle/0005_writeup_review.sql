CREATE TYPE "public"."review_decision" AS ENUM('publish', 'request_changes', 'decline', 'withdraw');--> statement-breakpoint
CREATE TABLE "comments" (
	"id" serial PRIMARY KEY NOT NULL,
	"writeup_id" integer NOT NULL,
	"user_id" integer NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "done_too" (
	"writeup_id" integer NOT NULL,
	"hull_number" integer NOT NULL,
	"user_id" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "done_too_writeup_id_hull_number_pk" PRIMARY KEY("writeup_id","hull_number")
);
--> statement-breakpoint
CREATE TABLE "review_decisions" (
	"id" serial PRIMARY KEY NOT NULL,
	"revision_id" integer NOT NULL,
	"decided_by" integer NOT NULL,
	"decision" "review_decision" NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"checklist" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "writeup_revisions" (
	"id" serial PRIMARY KEY NOT NULL,
	"writeup_id" integer NOT NULL,
	"number" integer NOT NULL,
	"status" "writeup_status" DEFAULT 'draft' NOT NULL,
	"author_id" integer NOT NULL,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"body_markdown" text DEFAULT '' NOT NULL,
	"systems" text[] DEFAULT '{}' NOT NULL,
	"zones" text[] DEFAULT '{}' NOT NULL,
	"hull_from" integer DEFAULT 1 NOT NULL,
	"hull_to" integer DEFAULT 612 NOT NULL,
	"boat_id" integer,
	"difficulty" "difficulty",
	"hours_spent" double precision,
	"cost_usd" double precision,
	"parts" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"submitted_at" timestamp with time zone,
	"decided_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "done_too" ADD CONSTRAINT "done_too_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "done_too" ADD CONSTRAINT "done_too_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decisions" ADD CONSTRAINT "review_decisions_revision_id_writeup_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."writeup_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decisions" ADD CONSTRAINT "review_decisions_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_revisions" ADD CONSTRAINT "writeup_revisions_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_revisions" ADD CONSTRAINT "writeup_revisions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_revisions" ADD CONSTRAINT "writeup_revisions_boat_id_boats_id_fk" FOREIGN KEY ("boat_id") REFERENCES "public"."boats"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "comments_writeup_idx" ON "comments" USING btree ("writeup_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "writeup_revisions_number_idx" ON "writeup_revisions" USING btree ("writeup_id","number");--> statement-breakpoint
CREATE INDEX "writeup_revisions_status_idx" ON "writeup_revisions" USING btree ("status","submitted_at");