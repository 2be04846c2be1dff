-- Search and list indexes for the office leads table (issue 5).
--
-- The table searches name, e-mail and phone (in contacts), town (in properties) and the
-- message (in leads). A search over a three-table join cannot use one index, so each lead
-- carries a denormalised, lower-cased `search_text`, indexed with a GIN trigram index
-- (pg_trgm). Trigrams match parts of words and digits ("quil", "555 01", "@copperleaf"),
-- which the office needs for phone numbers and e-mail addresses; full-text search would only
-- match whole words. The column is kept by triggers rather than by the app, so every writer
-- (the inquiry intake, staff edits, scripts, bulk seeding) keeps it right without knowing
-- about it. The column and the triggers live only in this migration (not in schema.ts):
-- no code writes the column directly, the leads module reads it with raw SQL.
CREATE EXTENSION IF NOT EXISTS pg_trgm;
--> statement-breakpoint
ALTER TABLE "leads" ADD COLUMN IF NOT EXISTS "search_text" text NOT NULL DEFAULT '';
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_lead_search_text(p_contact text, p_property text, p_message text)
RETURNS text LANGUAGE sql STABLE AS $$
	SELECT lower(concat_ws(' ',
		(SELECT concat_ws(' ', c.name, c.email, c.phone, c.phone_digits) FROM contacts c WHERE c.id = p_contact),
		(SELECT concat_ws(' ', p.street, p.town, p.postal_code) FROM properties p WHERE p.id = p_property),
		p_message))
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_leads_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	NEW.search_text := rillstone_lead_search_text(NEW.contact_id, NEW.property_id, NEW.message);
	RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER leads_search_text
	BEFORE INSERT OR UPDATE OF contact_id, property_id, message ON "leads"
	FOR EACH ROW EXECUTE FUNCTION rillstone_leads_search_trg();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_contacts_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	UPDATE leads SET search_text = rillstone_lead_search_text(contact_id, property_id, message)
	WHERE contact_id = NEW.id;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER contacts_search_text
	AFTER UPDATE OF name, email, phone, phone_digits ON "contacts"
	FOR EACH ROW EXECUTE FUNCTION rillstone_contacts_search_trg();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION rillstone_properties_search_trg() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	UPDATE leads SET search_text = rillstone_lead_search_text(contact_id, property_id, message)
	WHERE property_id = NEW.id;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER properties_search_text
	AFTER UPDATE OF street, town, postal_code ON "properties"
	FOR EACH ROW EXECUTE FUNCTION rillstone_properties_search_trg();
--> statement-breakpoint
UPDATE leads SET search_text = rillstone_lead_search_text(contact_id, property_id, message);
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_search_trgm_idx" ON "leads" USING gin ("search_text" gin_trgm_ops);
--> statement-breakpoint
-- Leads still waiting for their first reply (Today, the "awaiting" filter), oldest first.
CREATE INDEX IF NOT EXISTS "leads_awaiting_idx" ON "leads" ("created_at") WHERE "first_reply_at" IS NULL;
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_last_touch_idx" ON "leads" ("last_touch_at");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_source_created_idx" ON "leads" ("created_at", "source");
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "leads_services_idx" ON "leads" USING gin ("services");
