ALTER TABLE "contacts" ADD COLUMN "merged_into_id" text;--> statement-breakpoint
ALTER TABLE "contacts" ADD COLUMN "merged_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "contacts" ADD CONSTRAINT "contacts_merged_into_id_contacts_id_fk" FOREIGN KEY ("merged_into_id") REFERENCES "public"."contacts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "contacts_merged_into_idx" ON "contacts" USING btree ("merged_into_id");