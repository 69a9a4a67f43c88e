DROP INDEX "writeups_search_filters_idx";--> statement-breakpoint
DROP INDEX "writeups_search_idx";--> statement-breakpoint
CREATE INDEX "writeups_search_idx" ON "writeups" USING gin ("search","search_filters") WHERE status = 'published';