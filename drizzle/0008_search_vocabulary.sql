-- Search: the class's vocabulary (docs/decisions/0006-search-vocabulary-by-query-expansion.md), with
-- what keeps the search columns of 0006_search and 0007_search_tags_weight up to date.
-- 1. writeups.search_tags: the names of a write-up's systems and zones, kept by triggers on the
--    tag tables (and on renames of a system or a zone), so every writer of tags keeps it right.
CREATE FUNCTION search_refresh_tags(ids integer[]) RETURNS void LANGUAGE sql AS $$
  UPDATE writeups w SET search_tags = t.tags
    FROM (
      SELECT i.id, concat_ws(' ',
        (SELECT string_agg(s.name, ' ' ORDER BY s.sort_order, s.slug) FROM writeup_systems ws
           JOIN systems s ON s.slug = ws.system_slug WHERE ws.writeup_id = i.id),
        (SELECT string_agg(z.name, ' ' ORDER BY z.sort_order, z.slug) FROM writeup_zones wz
           JOIN zones z ON z.slug = wz.zone_slug WHERE wz.writeup_id = i.id)) AS tags
      FROM unnest(ids) AS i(id)
    ) t
   WHERE w.id = t.id AND w.search_tags IS DISTINCT FROM t.tags
$$;
--> statement-breakpoint
CREATE FUNCTION search_tags_changed() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    PERFORM search_refresh_tags(array(SELECT DISTINCT writeup_id FROM new_rows));
  ELSIF TG_OP = 'DELETE' THEN
    PERFORM search_refresh_tags(array(SELECT DISTINCT writeup_id FROM old_rows));
  ELSE
    PERFORM search_refresh_tags(array(SELECT writeup_id FROM new_rows UNION SELECT writeup_id FROM old_rows));
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER writeup_systems_search_insert AFTER INSERT ON writeup_systems
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE TRIGGER writeup_systems_search_update AFTER UPDATE ON writeup_systems
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE TRIGGER writeup_systems_search_delete AFTER DELETE ON writeup_systems
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE TRIGGER writeup_zones_search_insert AFTER INSERT ON writeup_zones
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE TRIGGER writeup_zones_search_update AFTER UPDATE ON writeup_zones
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE TRIGGER writeup_zones_search_delete AFTER DELETE ON writeup_zones
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION search_tags_changed();
--> statement-breakpoint
CREATE FUNCTION search_tag_renamed() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_TABLE_NAME = 'systems' THEN
    PERFORM search_refresh_tags(array(SELECT writeup_id FROM writeup_systems WHERE system_slug = NEW.slug));
  ELSE
    PERFORM search_refresh_tags(array(SELECT writeup_id FROM writeup_zones WHERE zone_slug = NEW.slug));
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER systems_search_rename AFTER UPDATE OF name, sort_order ON systems
  FOR EACH ROW WHEN (OLD.name IS DISTINCT FROM NEW.name OR OLD.sort_order IS DISTINCT FROM NEW.sort_order)
  EXECUTE FUNCTION search_tag_renamed();
--> statement-breakpoint
CREATE TRIGGER zones_search_rename AFTER UPDATE OF name, sort_order ON zones
  FOR EACH ROW WHEN (OLD.name IS DISTINCT FROM NEW.name OR OLD.sort_order IS DISTINCT FROM NEW.sort_order)
  EXECUTE FUNCTION search_tag_renamed();
--> statement-breakpoint
SELECT search_refresh_tags(array(SELECT id FROM writeups));
--> statement-breakpoint

-- 2. The vocabulary for "did you mean": every word of the published text (write-ups, spaces,
--    items) with the number of documents that use it, kept by statement triggers.
CREATE FUNCTION search_words(body text) RETURNS SETOF text LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT t.lexeme FROM unnest(to_tsvector('simple', coalesce(body, ''))) AS t
   WHERE t.lexeme ~ '^[[:alpha:]][[:alpha:]''-]*[[:alpha:]]$' AND length(t.lexeme) BETWEEN 3 AND 40
$$;
--> statement-breakpoint
-- The text of a row that goes into the vocabulary (null: none, e.g. a write-up not published).
CREATE FUNCTION search_vocabulary_text(source name, r jsonb) RETURNS text LANGUAGE sql IMMUTABLE AS $$
  SELECT CASE source
    WHEN 'writeups' THEN CASE WHEN r->>'status' = 'published'
      THEN concat_ws(' ', r->>'title', r->>'search_tags', r->>'summary', r->>'body_text') END
    WHEN 'spaces' THEN concat_ws(' ', r->>'name', r->>'obstructions')
    WHEN 'items' THEN concat_ws(' ', r->>'name', r->>'note')
  END
$$;
--> statement-breakpoint
CREATE FUNCTION search_vocabulary_apply(added text[], removed text[]) RETURNS void LANGUAGE sql AS $$
  INSERT INTO search_vocabulary AS v (word, documents)
  SELECT w.word, sum(x.delta)::int
    FROM (SELECT a AS body, 1 AS delta FROM unnest(added) a
          UNION ALL SELECT r, -1 FROM unnest(removed) r) x
    CROSS JOIN LATERAL search_words(x.body) AS w(word)
   WHERE x.body IS NOT NULL
   GROUP BY w.word
  HAVING sum(x.delta) <> 0
   ORDER BY w.word
  ON CONFLICT (word) DO UPDATE SET documents = v.documents + excluded.documents;
  DELETE FROM search_vocabulary WHERE documents <= 0;
$$;
--> statement-breakpoint
CREATE FUNCTION search_vocabulary_changed() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  added text[];
  removed text[];
BEGIN
  IF TG_OP = 'INSERT' THEN
    PERFORM search_vocabulary_apply(array(SELECT search_vocabulary_text(TG_TABLE_NAME, to_jsonb(n)) FROM new_rows n), '{}');
  ELSIF TG_OP = 'DELETE' THEN
    PERFORM search_vocabulary_apply('{}', array(SELECT search_vocabulary_text(TG_TABLE_NAME, to_jsonb(o)) FROM old_rows o));
  ELSE
    -- Only the rows whose words changed: an update of other columns parses nothing.
    WITH changed AS (
      SELECT search_vocabulary_text(TG_TABLE_NAME, to_jsonb(n)) AS new_text,
             search_vocabulary_text(TG_TABLE_NAME, to_jsonb(o)) AS old_text
        FROM new_rows n JOIN old_rows o USING (id)
    )
    SELECT array_agg(new_text) FILTER (WHERE new_text IS DISTINCT FROM old_text),
           array_agg(old_text) FILTER (WHERE new_text IS DISTINCT FROM old_text)
      INTO added, removed
      FROM changed;
    IF added IS NOT NULL THEN
      PERFORM search_vocabulary_apply(added, removed);
    END IF;
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER writeups_vocabulary_insert AFTER INSERT ON writeups
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER writeups_vocabulary_update AFTER UPDATE ON writeups
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER writeups_vocabulary_delete AFTER DELETE ON writeups
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER spaces_vocabulary_insert AFTER INSERT ON spaces
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER spaces_vocabulary_update AFTER UPDATE ON spaces
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER spaces_vocabulary_delete AFTER DELETE ON spaces
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER items_vocabulary_insert AFTER INSERT ON items
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER items_vocabulary_update AFTER UPDATE ON items
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
CREATE TRIGGER items_vocabulary_delete AFTER DELETE ON items
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION search_vocabulary_changed();
--> statement-breakpoint
INSERT INTO search_vocabulary (word, documents)
SELECT w.word, count(*)::int
  FROM (SELECT search_vocabulary_text('writeups', to_jsonb(t)) AS body FROM writeups t
        UNION ALL SELECT search_vocabulary_text('spaces', to_jsonb(t)) FROM spaces t
        UNION ALL SELECT search_vocabulary_text('items', to_jsonb(t)) FROM items t) d
  CROSS JOIN LATERAL search_words(d.body) AS w(word)
 WHERE d.body IS NOT NULL
 GROUP BY w.word;
--> statement-breakpoint

-- 3. Query expansion from the table of synonyms. Each term of a group becomes rewrite rules that
--    recognise it in a query typed loose (stern & locker) or as a phrase (stern <-> locker). A
--    query is rewritten twice with ts_rewrite (PostgreSQL documentation 12.4.2.1, "Query
--    Rewriting"): first every rule's target to a placeholder, longest targets first (so "quarter
--    berth" is taken before "berth"); then every placeholder to every term of its group as a
--    phrase, OR-ed. Two passes keep a substitute from being rewritten again by a later rule; any
--    term of a group so gives the same query as any other.
CREATE MATERIALIZED VIEW search_synonym_rules AS
WITH forms AS (
  SELECT DISTINCT ON (f.query::text) s.id, s.group_name, f.query
    FROM search_synonyms s
    CROSS JOIN LATERAL (VALUES (plainto_tsquery('english', s.term)), (phraseto_tsquery('english', s.term))) AS f(query)
   WHERE numnode(f.query) > 0
   ORDER BY f.query::text, s.id
), numbered AS (
  SELECT row_number() OVER (ORDER BY numnode(query) DESC, id, query::text)::int AS n, group_name, query
    FROM forms
)
SELECT r.n, r.group_name, r.query AS target,
       format('%L', '#syn' || r.n)::tsquery AS placeholder,
       (SELECT string_agg(format('(%s)', q), ' | ' ORDER BY q)
          FROM (SELECT DISTINCT phraseto_tsquery('english', s.term)::text AS q FROM search_synonyms s
                 WHERE s.group_name = r.group_name AND numnode(phraseto_tsquery('english', s.term)) > 0) g
       )::tsquery AS substitute
  FROM numbered r;
--> statement-breakpoint
CREATE UNIQUE INDEX search_synonym_rules_n_idx ON search_synonym_rules (n);
--> statement-breakpoint
CREATE FUNCTION search_synonyms_changed() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  REFRESH MATERIALIZED VIEW search_synonym_rules;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER search_synonyms_refresh AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON search_synonyms
  FOR EACH STATEMENT EXECUTE FUNCTION search_synonyms_changed();
--> statement-breakpoint
-- A query with the class's synonyms added: search_expand(websearch_to_tsquery('english', 'settee'))
-- = 'sette' | 'berth' | 'bunk'.
-- A query without any of the terms comes back exactly as it went in.
CREATE FUNCTION search_expand(query tsquery) RETURNS tsquery LANGUAGE sql STABLE AS $$
  WITH marked AS (SELECT ts_rewrite(query, 'SELECT target, placeholder FROM search_synonym_rules ORDER BY n') AS q)
  SELECT CASE WHEN strpos(q::text, '''#syn') > 0
              THEN ts_rewrite(q, 'SELECT placeholder, substitute FROM search_synonym_rules')
              ELSE query END
    FROM marked
$$;
--> statement-breakpoint
-- The class's vocabulary: the trade's words for the same thing. Admins may add more rows.
INSERT INTO search_synonyms (group_name, term) VALUES
  ('settee', 'settee'), ('settee', 'berth'), ('settee', 'bunk'),
  ('v-berth', 'V-berth'), ('v-berth', 'vee berth'), ('v-berth', 'forepeak'), ('v-berth', 'fore peak'),
  ('quarter berth', 'quarter berth'), ('quarter berth', 'quarter-berth'), ('quarter berth', 'quarterberth'),
  ('lazarette', 'lazarette'), ('lazarette', 'stern locker'),
  ('cockpit locker', 'cockpit locker'), ('cockpit locker', 'seat locker'),
  ('sole', 'sole'), ('sole', 'cabin sole'), ('sole', 'floor'), ('sole', 'floorboard'),
  ('head', 'head'), ('head', 'toilet'), ('head', 'marine head'),
  ('through-hull', 'through-hull'), ('through-hull', 'thru-hull'), ('through-hull', 'thru hull'), ('through-hull', 'skin fitting'),
  ('seacock', 'seacock'), ('seacock', 'sea cock'),
  ('holding tank', 'holding tank'), ('holding tank', 'waste tank'),
  ('galley', 'galley'), ('galley', 'kitchen'),
  ('deckhead', 'deckhead'), ('deckhead', 'headliner'), ('deckhead', 'headlining'),
  ('bulkhead', 'bulkhead'), ('bulkhead', 'wall'),
  ('cable', 'cable'), ('cable', 'wire'), ('cable', 'wiring'),
  ('chainplate', 'chainplate'), ('chainplate', 'chain plate'),
  ('cushion', 'cushion'), ('cushion', 'mattress'),
  ('outboard bracket', 'outboard bracket'), ('outboard bracket', 'motor mount'), ('outboard bracket', 'outboard mount'), ('outboard bracket', 'engine bracket'),
  ('bridge deck', 'bridge deck'), ('bridge deck', 'bridgedeck');
