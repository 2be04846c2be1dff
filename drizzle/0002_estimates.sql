CREATE TYPE "public"."estimate_status" AS ENUM('draft', 'sent', 'accepted', 'declined');--> statement-breakpoint
CREATE TABLE "estimate_acceptances" (
	"id" text PRIMARY KEY NOT NULL,
	"estimate_id" text NOT NULL,
	"estimate_number" integer NOT NULL,
	"typed_name" text NOT NULL,
	"accepted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"ip_address" text,
	"user_agent" text,
	"revision" integer NOT NULL,
	"options_chosen" jsonb NOT NULL,
	"total_cents" integer NOT NULL,
	"deposit_cents" integer NOT NULL,
	"result" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "estimate_acceptances_estimate_id_unique" UNIQUE("estimate_id")
);
--> statement-breakpoint
CREATE TABLE "estimates" (
	"id" text PRIMARY KEY NOT NULL,
	"lead_id" text NOT NULL,
	"number" integer NOT NULL,
	"status" "estimate_status" DEFAULT 'draft' NOT NULL,
	"design" jsonb NOT NULL,
	"overrides" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"result" jsonb,
	"catalog" jsonb,
	"scope" text DEFAULT '' NOT NULL,
	"total_cents" integer DEFAULT 0 NOT NULL,
	"tax_cents" integer DEFAULT 0 NOT NULL,
	"deposit_cents" integer DEFAULT 0 NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"updated_by" text,
	"created_by" text,
	"token_hash" text,
	"expires_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"sent_by" text,
	"declined_at" timestamp with time zone,
	"decline_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "estimates_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "estimating_settings" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"engine" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"terms" text DEFAULT '' NOT NULL,
	"valid_days" integer DEFAULT 30 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "labor_rates" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"cost_per_hour_cents" integer NOT NULL,
	"price_per_hour_cents" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "price_list_items" (
	"sku" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"category" text NOT NULL,
	"unit" text NOT NULL,
	"unit_cost_cents" integer NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"taxable" boolean DEFAULT true NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"attributes" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "pump_models" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"curve" jsonb NOT NULL,
	"watts" integer NOT NULL,
	"price_cents" integer NOT NULL,
	"cost_cents" integer,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "estimate_acceptances" ADD CONSTRAINT "estimate_acceptances_estimate_id_estimates_id_fk" FOREIGN KEY ("estimate_id") REFERENCES "public"."estimates"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "estimates" ADD CONSTRAINT "estimates_lead_id_leads_id_fk" FOREIGN KEY ("lead_id") REFERENCES "public"."leads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "estimates" ADD CONSTRAINT "estimates_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "estimates" ADD CONSTRAINT "estimates_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "estimates" ADD CONSTRAINT "estimates_sent_by_users_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "estimates_lead_number_idx" ON "estimates" USING btree ("lead_id","number");--> statement-breakpoint
CREATE INDEX "estimates_status_idx" ON "estimates" USING btree ("status","updated_at");--> statement-breakpoint
CREATE INDEX "price_list_items_category_idx" ON "price_list_items" USING btree ("category");