CREATE TABLE "search_synonyms" (
	"id" serial PRIMARY KEY NOT NULL,
	"group_name" text NOT NULL,
	"term" text NOT NULL,
	CONSTRAINT "search_synonyms_term_unique" UNIQUE("term")
);
--> statement-breakpoint
CREATE TABLE "search_vocabulary" (
	"word" text PRIMARY KEY NOT NULL,
	"documents" integer NOT NULL
);
--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "search" "tsvector" GENERATED ALWAYS AS (
    setweight(to_tsvector('english', coalesce(name, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(note, '')), 'C')) STORED;--> statement-breakpoint
ALTER TABLE "spaces" ADD COLUMN "search" "tsvector" GENERATED ALWAYS AS (
    setweight(to_tsvector('english', coalesce(name, '')), 'A') ||
    setweight(to_tsvector('english', replace(zone_slug, '-', ' ')), 'B') ||
    setweight(to_tsvector('english', coalesce(obstructions, '')), 'C')) STORED;--> statement-breakpoint
ALTER TABLE "writeups" ADD COLUMN "search_tags" text DEFAULT '' NOT NULL;--> statement-breakpoint
CREATE INDEX "search_synonyms_group_idx" ON "search_synonyms" USING btree ("group_name");--> statement-breakpoint
CREATE INDEX "search_vocabulary_trgm_idx" ON "search_vocabulary" USING gin ("word" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "items_search_idx" ON "items" USING gin ("search");--> statement-breakpoint
CREATE INDEX "spaces_search_idx" ON "spaces" USING gin ("search");