CREATE TYPE "public"."change_order_status" AS ENUM('draft', 'sent', 'approved', 'declined');--> statement-breakpoint
CREATE TYPE "public"."job_stage" AS ENUM('scheduled', 'underway', 'punch_list', 'complete', 'paid');--> statement-breakpoint
CREATE TABLE "care_reminders" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"season" text NOT NULL,
	"outbox_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_settings" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"enabled" boolean DEFAULT true NOT NULL,
	"shutdown_month" integer DEFAULT 10 NOT NULL,
	"startup_month" integer DEFAULT 4 NOT NULL,
	"testimonial_delay_days" integer DEFAULT 3 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "change_orders" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"number" integer NOT NULL,
	"status" "change_order_status" DEFAULT 'draft' NOT NULL,
	"title" text NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"lines" jsonb NOT NULL,
	"total_cents" integer NOT NULL,
	"token_hash" text,
	"token_expires_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"typed_name" text,
	"decided_at" timestamp with time zone,
	"ip_address" text,
	"user_agent" text,
	"accepted_total_cents" integer,
	"decline_reason" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "change_orders_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "job_days" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"day" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "job_materials" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"category" text NOT NULL,
	"sku" text DEFAULT '' NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"unit" text NOT NULL,
	"quantity" double precision NOT NULL,
	"change_order_id" text,
	"ordered_at" timestamp with time zone,
	"picked_at" timestamp with time zone,
	"picked_by" text,
	"sort_order" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" text PRIMARY KEY NOT NULL,
	"number" integer GENERATED ALWAYS AS IDENTITY (sequence name "jobs_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 501 CACHE 1),
	"estimate_id" text NOT NULL,
	"lead_id" text NOT NULL,
	"contact_id" text NOT NULL,
	"property_id" text,
	"stage" "job_stage" DEFAULT 'scheduled' NOT NULL,
	"title" text NOT NULL,
	"frozen" jsonb NOT NULL,
	"contract_cents" integer NOT NULL,
	"deposit_due_cents" integer NOT NULL,
	"crew_needed" integer DEFAULT 0 NOT NULL,
	"crew_size" integer,
	"crew_lead_id" text,
	"is_water_feature" boolean DEFAULT false NOT NULL,
	"started_at" timestamp with time zone,
	"completed_at" timestamp with time zone,
	"final_balance_cents" integer,
	"paid_at" timestamp with time zone,
	"care_token_hash" text,
	"care_opt_out_at" timestamp with time zone,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "jobs_number_unique" UNIQUE("number"),
	CONSTRAINT "jobs_estimate_id_unique" UNIQUE("estimate_id"),
	CONSTRAINT "jobs_care_token_hash_unique" UNIQUE("care_token_hash")
);
--> statement-breakpoint
CREATE TABLE "punch_items" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"body" text NOT NULL,
	"done_at" timestamp with time zone,
	"done_by" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "testimonials" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"token_expires_at" timestamp with time zone NOT NULL,
	"body" text,
	"display_name" text,
	"town" text,
	"submitted_at" timestamp with time zone,
	"approved_at" timestamp with time zone,
	"approved_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "testimonials_job_id_unique" UNIQUE("job_id"),
	CONSTRAINT "testimonials_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "job_id" text;--> statement-breakpoint
ALTER TABLE "care_reminders" ADD CONSTRAINT "care_reminders_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_orders" ADD CONSTRAINT "change_orders_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_orders" ADD CONSTRAINT "change_orders_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_days" ADD CONSTRAINT "job_days_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_materials" ADD CONSTRAINT "job_materials_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_materials" ADD CONSTRAINT "job_materials_picked_by_users_id_fk" FOREIGN KEY ("picked_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_estimate_id_estimates_id_fk" FOREIGN KEY ("estimate_id") REFERENCES "public"."estimates"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_lead_id_leads_id_fk" FOREIGN KEY ("lead_id") REFERENCES "public"."leads"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_contact_id_contacts_id_fk" FOREIGN KEY ("contact_id") REFERENCES "public"."contacts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_crew_lead_id_users_id_fk" FOREIGN KEY ("crew_lead_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "punch_items" ADD CONSTRAINT "punch_items_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "punch_items" ADD CONSTRAINT "punch_items_done_by_users_id_fk" FOREIGN KEY ("done_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "punch_items" ADD CONSTRAINT "punch_items_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "testimonials" ADD CONSTRAINT "testimonials_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "testimonials" ADD CONSTRAINT "testimonials_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "care_reminders_job_season_idx" ON "care_reminders" USING btree ("job_id","season");--> statement-breakpoint
CREATE UNIQUE INDEX "change_orders_job_number_idx" ON "change_orders" USING btree ("job_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "job_days_job_day_idx" ON "job_days" USING btree ("job_id","day");--> statement-breakpoint
CREATE INDEX "job_days_day_idx" ON "job_days" USING btree ("day");--> statement-breakpoint
CREATE INDEX "job_materials_job_idx" ON "job_materials" USING btree ("job_id","sort_order");--> statement-breakpoint
CREATE INDEX "jobs_stage_idx" ON "jobs" USING btree ("stage");--> statement-breakpoint
CREATE INDEX "jobs_crew_lead_idx" ON "jobs" USING btree ("crew_lead_id");--> statement-breakpoint
CREATE INDEX "punch_items_job_idx" ON "punch_items" USING btree ("job_id");--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;