ALTER TABLE "writeups" ADD COLUMN "search_filters" text[] DEFAULT '{}'::text[] NOT NULL;--> statement-breakpoint
CREATE INDEX "spaces_zone_idx" ON "spaces" USING btree ("zone_slug");--> statement-breakpoint
CREATE INDEX "writeups_search_filters_idx" ON "writeups" USING gin ("search_filters") WHERE status = 'published';--> statement-breakpoint
CREATE INDEX "writeups_title_search_idx" ON "writeups" USING gin (to_tsvector('english', "title")) WHERE status = 'published';--> statement-breakpoint
-- The filter words of a write-up ("system:<slug>", "zone:<slug>") are kept with its tags by the
-- triggers of 0008_search_vocabulary (which call this function), so a system or zone filter is a
-- GIN index lookup combined with the words' one (app/models/search.server.ts).
CREATE OR REPLACE FUNCTION search_refresh_tags(ids integer[]) RETURNS void LANGUAGE sql AS $$
  UPDATE writeups w SET search_tags = t.tags, search_filters = t.filters
    FROM (
      SELECT i.id, concat_ws(' ',
        (SELECT string_agg(s.name, ' ' ORDER BY s.sort_order, s.slug) FROM writeup_systems ws
           JOIN systems s ON s.slug = ws.system_slug WHERE ws.writeup_id = i.id),
        (SELECT string_agg(z.name, ' ' ORDER BY z.sort_order, z.slug) FROM writeup_zones wz
           JOIN zones z ON z.slug = wz.zone_slug WHERE wz.writeup_id = i.id)) AS tags,
        array(SELECT f FROM (
                SELECT 'system:' || ws.system_slug AS f FROM writeup_systems ws WHERE ws.writeup_id = i.id
                UNION ALL
                SELECT 'zone:' || wz.zone_slug FROM writeup_zones wz WHERE wz.writeup_id = i.id) x
              ORDER BY f) AS filters
      FROM unnest(ids) AS i(id)
    ) t
   WHERE w.id = t.id AND (w.search_tags IS DISTINCT FROM t.tags OR w.search_filters IS DISTINCT FROM t.filters)
$$;
--> statement-breakpoint
-- A write-up's search column (some 1.3 kB) stays in the row, compressed if need be, rather than
-- in the TOAST table: the search reads it for every match it checks and ranks, and a TOAST read
-- costs an index lookup each time (PostgreSQL 15 documentation, 73.2 "TOAST"; the long body text
-- goes out of line instead). Rewriting every row stores the existing ones that way too.
ALTER TABLE "writeups" ALTER COLUMN "search" SET STORAGE MAIN;
--> statement-breakpoint
UPDATE "writeups" SET "search_filters" = '{}'::text[];
--> statement-breakpoint
SELECT search_refresh_tags(array(SELECT id FROM writeups));
