-- Lead search: the page of a search read from fewer rows, and the stage counts of a view reused
-- while no lead changes.
--
-- 1. `search_words` also holds the lead's stage as a lexeme of its own ("~stage:new"), like its
--    services, and each service with the stage ("~service-stage:pond:new"): a word search filtered
--    by stage (and service) then finds only the leads of those stages in one GIN scan, instead of
--    reading every match of the other stages from the table to drop them. The pairs are far rarer
--    than either alone, so the GIN scan walks the pairs' short lists and skips through the rest.
-- 2. `lead_list_changes`: the id of each transaction that wrote leads, one row per transaction,
--    kept by a statement-level trigger. The app keeps the stage counts of a view with the
--    snapshot they were counted in, and counts again only when a transaction that snapshot could
--    not see has since committed a change to leads (src/lib/server/leads/list-sql.ts). Each
--    writer inserts its own id, so writers never wait on each other for it; rows older than a
--    day are removed now and then by a writer (the app keeps counts for minutes only).
-- Like `search_text`, these live only in migrations (not in schema.ts): no code writes them.
CREATE OR REPLACE FUNCTION rillstone_stage_lexemes(p_services text[], p_stage lead_stage)
RETURNS tsvector LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
	SELECT array_to_tsvector(array['~stage:' || p_stage::text] || array(
		SELECT '~service-stage:' || s || ':' || p_stage::text FROM unnest(p_services) s WHERE s <> ''
	))
$$;
--> statement-breakpoint
DROP INDEX IF EXISTS "leads_search_words_idx";
--> statement-breakpoint
ALTER TABLE "leads" DROP COLUMN IF EXISTS "search_words";
--> statement-breakpoint
ALTER TABLE "leads" ADD COLUMN "search_words" tsvector
	GENERATED ALWAYS AS (
		to_tsvector('public.rillstone_names'::regconfig, "search_text")
			|| rillstone_service_lexemes("services") || rillstone_stage_lexemes("services", "stage")
	) STORED;
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_search_words_idx" ON "leads" USING gin ("search_words");
--> statement-breakpoint
CREATE TABLE IF NOT EXISTS "lead_list_changes" (
	"xid" xid8 PRIMARY KEY,
	"at" timestamptz NOT NULL DEFAULT clock_timestamp()
);
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_lead_list_changes_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	INSERT INTO lead_list_changes (xid) VALUES (pg_current_xact_id()) ON CONFLICT DO NOTHING;
	-- Now and then, one writer at a time (the others skip it rather than wait).
	IF random() < 0.01 AND pg_try_advisory_xact_lock(hashtext('rillstone_lead_list_changes')) THEN
		DELETE FROM lead_list_changes WHERE at < clock_timestamp() - interval '1 day';
	END IF;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER leads_list_changes AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "leads"
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_list_changes_trg();
--> statement-breakpoint
-- 3. `lead_words`: every word of search_words (not the `~` lexemes), kept by statement-level
--    triggers on leads (new words only; a word no lead holds any more stays, harmlessly). A word
--    searched for matches by its start; a prefix match in the GIN index ("patio:*") collects every
--    posting of every matching word into a bitmap before it can intersect anything, several times
--    the cost of exact words. `rillstone_words_query` looks the starts up here first and asks the
--    index for those exact words (`'patio' | 'patios'`), keeping the prefix match only for a start
--    shared by more than 32 words. No unique key: a writer adds the words it does not see, never
--    waiting on another writer's uncommitted words, so two writers may add the same new word
--    twice, which the lookup's DISTINCT absorbs.
CREATE TABLE IF NOT EXISTS "lead_words" ("word" text COLLATE "C" NOT NULL);
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "lead_words_word_idx" ON "lead_words" ("word");
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_lead_words_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	INSERT INTO lead_words (word)
	SELECT DISTINCT w FROM new_rows n, unnest(tsvector_to_array(n.search_words)) w
	WHERE left(w, 1) <> '~' AND NOT EXISTS (SELECT 1 FROM lead_words x WHERE x.word = w);
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER leads_words_insert AFTER INSERT ON "leads"
	REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_words_trg();
--> statement-breakpoint
CREATE TRIGGER leads_words_update AFTER UPDATE ON "leads"
	REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_words_trg();
--> statement-breakpoint
INSERT INTO lead_words (word)
SELECT DISTINCT w FROM leads, unnest(tsvector_to_array(search_words)) w
WHERE left(w, 1) <> '~';
--> statement-breakpoint
-- Each part must begin a word: the tsquery of all parts (AND), each part the OR of the words it
-- begins, or its prefix match when it begins more than 32 (or does not make exactly one lexeme).
CREATE OR REPLACE FUNCTION rillstone_words_query(p_parts text[]) RETURNS tsquery
LANGUAGE plpgsql STABLE PARALLEL SAFE AS $$
DECLARE
	result tsquery;
	part text;
	lexemes text[];
	words text[];
	alternatives tsquery;
BEGIN
	FOREACH part IN ARRAY p_parts LOOP
		lexemes := tsvector_to_array(to_tsvector('public.rillstone_names'::regconfig, part));
		IF cardinality(lexemes) = 1 THEN
			words := array(
				SELECT DISTINCT word FROM lead_words
				WHERE word >= lexemes[1] AND word < lexemes[1] || chr(1114111)
				ORDER BY word LIMIT 33
			);
		ELSE
			words := NULL;
		END IF;
		IF words IS NULL OR cardinality(words) > 32 OR cardinality(words) = 0 THEN
			alternatives := to_tsquery('public.rillstone_names'::regconfig,
				'''' || replace(replace(part, '\', '\\'), '''', '''''') || ''':*');
		ELSE
			alternatives := (
				SELECT string_agg('''' || replace(replace(w, '\', '\\'), '''', '''''') || '''', ' | ')
				FROM unnest(words) w
			)::tsquery;
		END IF;
		result := CASE WHEN result IS NULL THEN alternatives ELSE result && alternatives END;
	END LOOP;
	RETURN result;
END $$;
