CREATE TYPE "public"."measurement_change" AS ENUM('edited', 'deleted');--> statement-breakpoint
CREATE TABLE "measurement_changes" (
	"id" serial PRIMARY KEY NOT NULL,
	"space_id" integer NOT NULL,
	"measurement_id" integer NOT NULL,
	"kind" "measurement_change" NOT NULL,
	"changed_by" integer,
	"taken_by" integer,
	"before" jsonb NOT NULL,
	"after" jsonb,
	"reason" text DEFAULT '' NOT NULL,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
DROP INDEX "space_sections_space_idx";--> statement-breakpoint
CREATE UNIQUE INDEX "space_sections_space_idx" ON "space_sections" USING btree ("space_id","position");--> statement-breakpoint
ALTER TABLE "space_measurements" ADD COLUMN "section" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD COLUMN "updated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD COLUMN "updated_by" integer;--> statement-breakpoint
ALTER TABLE "measurement_changes" ADD CONSTRAINT "measurement_changes_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurement_changes" ADD CONSTRAINT "measurement_changes_changed_by_users_id_fk" FOREIGN KEY ("changed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurement_changes" ADD CONSTRAINT "measurement_changes_taken_by_users_id_fk" FOREIGN KEY ("taken_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "measurement_changes_space_idx" ON "measurement_changes" USING btree ("space_id","changed_at");--> statement-breakpoint
ALTER TABLE "space_measurements" ADD CONSTRAINT "space_measurements_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD CONSTRAINT "space_measurements_section_fk" FOREIGN KEY ("space_id","section") REFERENCES "public"."space_sections"("space_id","position") ON DELETE cascade ON UPDATE cascade;