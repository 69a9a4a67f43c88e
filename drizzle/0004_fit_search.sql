CREATE TYPE "public"."item_kind" AS ENUM('battery-group', 'member-item');--> statement-breakpoint
CREATE TYPE "public"."item_orientation" AS ENUM('any', 'upright');--> statement-breakpoint
CREATE TABLE "items" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"name" text NOT NULL,
	"kind" "item_kind" NOT NULL,
	"length_mm" double precision NOT NULL,
	"width_mm" double precision NOT NULL,
	"height_mm" double precision NOT NULL,
	"weight_kg" double precision,
	"orientation" "item_orientation" DEFAULT 'any' NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"added_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "items_slug_unique" UNIQUE("slug"),
	CONSTRAINT "items_positive_size" CHECK ("items"."length_mm" > 0 and "items"."width_mm" > 0 and "items"."height_mm" > 0)
);
--> statement-breakpoint
ALTER TABLE "space_measurements" ADD COLUMN "photo_id" integer;--> statement-breakpoint
ALTER TABLE "space_sections" ADD COLUMN "consensus_length_mm" double precision;--> statement-breakpoint
ALTER TABLE "space_sections" ADD COLUMN "consensus_width_mm" double precision;--> statement-breakpoint
ALTER TABLE "space_sections" ADD COLUMN "consensus_height_mm" double precision;--> statement-breakpoint
ALTER TABLE "space_sections" ADD COLUMN "fit_any" "cube" GENERATED ALWAYS AS (cube(array[
    greatest(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm), coalesce(consensus_height_mm, height_mm)),
    greatest(least(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm)), least(greatest(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm)), coalesce(consensus_height_mm, height_mm))),
    least(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm), coalesce(consensus_height_mm, height_mm)),
    coalesce(consensus_length_mm, length_mm) * coalesce(consensus_width_mm, width_mm) * coalesce(consensus_height_mm, height_mm)]::float8[])) STORED NOT NULL;--> statement-breakpoint
ALTER TABLE "space_sections" ADD COLUMN "fit_upright" "cube" GENERATED ALWAYS AS (cube(array[
    greatest(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm)),
    least(coalesce(consensus_length_mm, length_mm), coalesce(consensus_width_mm, width_mm)),
    coalesce(consensus_height_mm, height_mm),
    coalesce(consensus_length_mm, length_mm) * coalesce(consensus_width_mm, width_mm) * coalesce(consensus_height_mm, height_mm)]::float8[])) STORED NOT NULL;--> statement-breakpoint
ALTER TABLE "items" ADD CONSTRAINT "items_added_by_users_id_fk" FOREIGN KEY ("added_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_measurements" ADD CONSTRAINT "space_measurements_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "space_measurements_space_idx" ON "space_measurements" USING btree ("space_id");--> statement-breakpoint
CREATE INDEX "space_sections_space_idx" ON "space_sections" USING btree ("space_id","position");--> statement-breakpoint
CREATE INDEX "space_sections_fit_any_idx" ON "space_sections" USING gist ("fit_any");--> statement-breakpoint
CREATE INDEX "space_sections_fit_upright_idx" ON "space_sections" USING gist ("fit_upright");