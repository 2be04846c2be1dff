-- Lead search by words, and an index for the budget sort.
--
-- Searching every term with LIKE through the trigram index made PostgreSQL recheck thousands of
-- rows for a common word ("patio"). Whole words (names, towns, message text) are now searched
-- with full-text search: `search_words`, a tsvector generated from `search_text` with the
-- `rillstone_names` configuration (the `simple` parser and dictionary, so no stemming and no stop
-- words, which suits names; accents removed by `unaccent`, so "Zoe" finds "Zoë"), in a GIN index.
-- Words match by prefix ("brook" finds "Brookstone"). Terms with digits or other characters,
-- such as phone numbers and e-mail fragments, keep the trigram index on `search_text`.
-- Like `search_text`, the column lives only in migrations (not in schema.ts): no code writes it.
CREATE EXTENSION IF NOT EXISTS unaccent;
--> statement-breakpoint
DO $$
BEGIN
	IF NOT EXISTS (SELECT 1 FROM pg_ts_config WHERE cfgname = 'rillstone_names') THEN
		CREATE TEXT SEARCH CONFIGURATION rillstone_names (COPY = pg_catalog.simple);
		ALTER TEXT SEARCH CONFIGURATION rillstone_names
			ALTER MAPPING FOR asciiword, asciihword, hword_asciipart, word, hword, hword_part
			WITH unaccent, simple;
	END IF;
END $$;
--> statement-breakpoint
-- The lead's services as lexemes of their own ("~service:pond"; no word of the parser starts with
-- "~"), so that a search with a service filter is one GIN scan instead of two bitmaps ANDed.
CREATE OR REPLACE FUNCTION rillstone_service_lexemes(p_services text[]) RETURNS tsvector
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
	SELECT array_to_tsvector(array(SELECT '~service:' || s FROM unnest(p_services) s WHERE s <> ''))
$$;
--> statement-breakpoint
ALTER TABLE "leads" ADD COLUMN IF NOT EXISTS "search_words" tsvector
	GENERATED ALWAYS AS (
		to_tsvector('public.rillstone_names'::regconfig, "search_text") || rillstone_service_lexemes("services")
	) STORED;
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_search_words_idx" ON "leads" USING gin ("search_words");
--> statement-breakpoint
-- The budget sort's key, exactly as the list query writes it (SORT_SQL in leads-sql.ts: the
-- budgets in ascending order, unknown ones last); `budget` is included so that the planner can
-- read a page from the index alone.
CREATE INDEX IF NOT EXISTS "leads_list_budget_idx" ON "leads"
	((coalesce(array_position(array['under-5k','5k-15k','15k-30k','30k-plus','unsure']::text[], "budget"), 6)), "number")
	INCLUDE ("id", "stage", "budget");
