CREATE TYPE "public"."visit_status" AS ENUM('booked', 'cancelled');--> statement-breakpoint
CREATE TABLE "availability" (
	"user_id" text PRIMARY KEY NOT NULL,
	"weekly_hours" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"visit_minutes" integer DEFAULT 60 NOT NULL,
	"buffer_minutes" integer DEFAULT 30 NOT NULL,
	"notice_minutes" integer DEFAULT 120 NOT NULL,
	"days_ahead" integer DEFAULT 21 NOT NULL,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site_visits" (
	"id" text PRIMARY KEY NOT NULL,
	"lead_id" text NOT NULL,
	"salesperson_id" text NOT NULL,
	"status" "visit_status" DEFAULT 'booked' NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"buffer_minutes" integer NOT NULL,
	"blocked" "tstzrange" NOT NULL,
	"time_zone" text NOT NULL,
	"sequence" integer DEFAULT 0 NOT NULL,
	"note_for_homeowner" text DEFAULT '' NOT NULL,
	"token_hash" text NOT NULL,
	"token_expires_at" timestamp with time zone NOT NULL,
	"confirmed_at" timestamp with time zone,
	"change_request" text,
	"change_requested_at" timestamp with time zone,
	"cancelled_at" timestamp with time zone,
	"cancelled_by" text,
	"cancel_reason" text,
	"notes" jsonb,
	"notes_updated_at" timestamp with time zone,
	"notes_updated_by" text,
	"booked_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_visits_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "time_off" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "visit_id" text;--> statement-breakpoint
ALTER TABLE "availability" ADD CONSTRAINT "availability_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "availability" ADD CONSTRAINT "availability_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_visits" ADD CONSTRAINT "site_visits_lead_id_leads_id_fk" FOREIGN KEY ("lead_id") REFERENCES "public"."leads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_visits" ADD CONSTRAINT "site_visits_salesperson_id_users_id_fk" FOREIGN KEY ("salesperson_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_visits" ADD CONSTRAINT "site_visits_notes_updated_by_users_id_fk" FOREIGN KEY ("notes_updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_visits" ADD CONSTRAINT "site_visits_booked_by_users_id_fk" FOREIGN KEY ("booked_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "time_off" ADD CONSTRAINT "time_off_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_visits_person_idx" ON "site_visits" USING btree ("salesperson_id","starts_at");--> statement-breakpoint
CREATE INDEX "site_visits_lead_idx" ON "site_visits" USING btree ("lead_id");--> statement-breakpoint
CREATE UNIQUE INDEX "site_visits_one_booked_per_lead" ON "site_visits" USING btree ("lead_id") WHERE "site_visits"."status" = 'booked';--> statement-breakpoint
CREATE INDEX "time_off_user_idx" ON "time_off" USING btree ("user_id","starts_at");--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_visit_id_site_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."site_visits"("id") ON DELETE set null ON UPDATE no action;