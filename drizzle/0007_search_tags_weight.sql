DROP INDEX "writeups_search_idx";--> statement-breakpoint
ALTER TABLE "writeups" drop column "search";--> statement-breakpoint
ALTER TABLE "writeups" ADD COLUMN "search" "tsvector" GENERATED ALWAYS AS (
    setweight(to_tsvector('english', coalesce(title, '')), 'A') ||
    setweight(to_tsvector('english', coalesce(search_tags, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(summary, '')), 'B') ||
    setweight(to_tsvector('english', coalesce(body_text, '')), 'C')) STORED;--> statement-breakpoint
CREATE INDEX "writeups_search_idx" ON "writeups" USING gin ("search") WHERE status = 'published';