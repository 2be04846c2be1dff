CREATE TABLE "site_visit_links" (
	"token_hash" text PRIMARY KEY NOT NULL,
	"visit_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "site_visit_links" ADD CONSTRAINT "site_visit_links_visit_id_site_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."site_visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_visit_links_visit_idx" ON "site_visit_links" USING btree ("visit_id");