-- Speed of the office leads list at 100,000 leads (issue 5, `npm run bench:leads`).
--
-- 1. Sort keys on the lead itself. Sorting by name or town needed the contacts and properties
--    joins before paging; `sort_name` and `sort_town` (lower-cased, kept by the same triggers as
--    `search_text`) let the list pick its page of lead ids from one index and join only those rows.
-- 2. One index per sort, each (key, number) so the order is total and a backward scan serves
--    both directions, with `id` and `stage` included so the page is chosen index-only (no heap
--    visit for the rows skipped by OFFSET, nor for a stage filter).
-- 3. `lead_counts`: the number of leads per stage, assignee, budget and "no reply yet", kept
--    by statement-level triggers (transition tables, so a 2,000-row insert is one upsert). The
--    stage facets and the total under those filters are a sum over a few hundred rows instead
--    of a count over every lead. Other filters (service, dates, search) still count exactly,
--    through their indexes. Counter rows are upserted in key order, so two writers cannot
--    deadlock on them. Like `search_text`, these live only in this migration (not in
--    schema.ts): no code writes them, the list reads them with raw SQL (src/lib/server/leads-sql.ts).
ALTER TABLE "leads" ADD COLUMN IF NOT EXISTS "sort_name" text NOT NULL DEFAULT '';
--> statement-breakpoint
ALTER TABLE "leads" ADD COLUMN IF NOT EXISTS "sort_town" text NOT NULL DEFAULT '';
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_leads_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	NEW.search_text := rillstone_lead_search_text(NEW.contact_id, NEW.property_id, NEW.message);
	NEW.sort_name := coalesce((SELECT lower(c.name) FROM contacts c WHERE c.id = NEW.contact_id), '');
	NEW.sort_town := coalesce((SELECT lower(p.town) FROM properties p WHERE p.id = NEW.property_id), '');
	RETURN NEW;
END $$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_contacts_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	UPDATE leads SET search_text = rillstone_lead_search_text(contact_id, property_id, message),
		sort_name = lower(NEW.name)
	WHERE contact_id = NEW.id;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_properties_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	UPDATE leads SET search_text = rillstone_lead_search_text(contact_id, property_id, message),
		sort_town = coalesce(lower(NEW.town), '')
	WHERE property_id = NEW.id;
	RETURN NULL;
END $$;
--> statement-breakpoint
UPDATE leads l SET sort_name = lower(c.name) FROM contacts c WHERE c.id = l.contact_id;
--> statement-breakpoint
UPDATE leads l SET sort_town = coalesce(lower(p.town), '') FROM properties p WHERE p.id = l.property_id;
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_list_received_idx" ON "leads" ("created_at", "number") INCLUDE ("id", "stage");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_list_name_idx" ON "leads" ("sort_name", "number") INCLUDE ("id", "stage");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_list_town_idx" ON "leads" ("sort_town", "number") INCLUDE ("id", "stage");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_list_stage_idx" ON "leads" ("stage", "number") INCLUDE ("id");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_list_last_touch_idx" ON "leads" ("last_touch_at", "number") INCLUDE ("id", "stage");
--> statement-breakpoint
CREATE TABLE IF NOT EXISTS "lead_counts" (
	"stage" lead_stage NOT NULL,
	-- '' for unassigned leads, so the key has no null in it.
	"assignee_id" text NOT NULL,
	"budget" text NOT NULL,
	-- first_reply_at is null
	"unreplied" boolean NOT NULL,
	"n" integer NOT NULL,
	PRIMARY KEY ("stage", "assignee_id", "budget", "unreplied")
);
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_lead_counts_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP = 'INSERT' THEN
		INSERT INTO lead_counts AS lc (stage, assignee_id, budget, unreplied, n)
		SELECT stage, coalesce(assignee_id, ''), budget, first_reply_at IS NULL, count(*)::int
		FROM new_rows GROUP BY 1, 2, 3, 4 ORDER BY 1, 2, 3, 4
		ON CONFLICT (stage, assignee_id, budget, unreplied) DO UPDATE SET n = lc.n + excluded.n;
	ELSIF TG_OP = 'DELETE' THEN
		INSERT INTO lead_counts AS lc (stage, assignee_id, budget, unreplied, n)
		SELECT stage, coalesce(assignee_id, ''), budget, first_reply_at IS NULL, -count(*)::int
		FROM old_rows GROUP BY 1, 2, 3, 4 ORDER BY 1, 2, 3, 4
		ON CONFLICT (stage, assignee_id, budget, unreplied) DO UPDATE SET n = lc.n + excluded.n;
	ELSE
		INSERT INTO lead_counts AS lc (stage, assignee_id, budget, unreplied, n)
		SELECT stage, a, budget, u, sum(d)::int FROM (
			SELECT stage, coalesce(assignee_id, '') AS a, budget, first_reply_at IS NULL AS u, 1 AS d FROM new_rows
			UNION ALL
			SELECT stage, coalesce(assignee_id, ''), budget, first_reply_at IS NULL, -1 FROM old_rows
		) AS changes
		GROUP BY 1, 2, 3, 4 HAVING sum(d) <> 0 ORDER BY 1, 2, 3, 4
		ON CONFLICT (stage, assignee_id, budget, unreplied) DO UPDATE SET n = lc.n + excluded.n;
	END IF;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_lead_counts_truncate_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	DELETE FROM lead_counts;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER leads_counts_insert AFTER INSERT ON "leads"
	REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_counts_trg();
--> statement-breakpoint
CREATE TRIGGER leads_counts_update AFTER UPDATE ON "leads"
	REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_counts_trg();
--> statement-breakpoint
CREATE TRIGGER leads_counts_delete AFTER DELETE ON "leads"
	REFERENCING OLD TABLE AS old_rows
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_counts_trg();
--> statement-breakpoint
CREATE TRIGGER leads_counts_truncate AFTER TRUNCATE ON "leads"
	FOR EACH STATEMENT EXECUTE FUNCTION rillstone_lead_counts_truncate_trg();
--> statement-breakpoint
-- The migrator runs in one transaction and ALTER TABLE above holds an exclusive lock on leads
-- until it commits, so no lead written meanwhile is counted twice or missed.
INSERT INTO lead_counts (stage, assignee_id, budget, unreplied, n)
SELECT stage, coalesce(assignee_id, ''), budget, first_reply_at IS NULL, count(*)::int
FROM leads GROUP BY 1, 2, 3, 4;
